import { useSyncExternalStore } from 'react';

/**
 * The id of the person signed in on this page: the one answer for code outside React (the step
 * clock's tap queue stamps and checks it) and for components (drafts are filed under it). Set by
 * the signed-in layout; null when nobody is signed in.
 */
let currentId: number | null = null;
const listeners = new Set<() => void>();

export function setCurrentPersonId(id: number | null): void {
  if (id === currentId) return;
  currentId = id;
  for (const listener of listeners) listener();
}

export function currentPersonId(): number | null {
  return currentId;
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** The signed-in person's id in a component; it renders again when another person signs in. */
export function useCurrentPersonId(): number | null {
  return useSyncExternalStore(subscribe, currentPersonId, currentPersonId);
}
