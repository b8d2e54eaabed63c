/**
 * The id of the person signed in on this page, for code outside React (the step clock's tap
 * queue stamps and checks it). Set by the signed-in layout; null when nobody is signed in.
 */
let currentId: number | null = null;

export function setCurrentPersonId(id: number | null): void {
  currentId = id;
}

export function currentPersonId(): number | null {
  return currentId;
}
