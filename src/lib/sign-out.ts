/**
 * What this browser keeps for the signed-in person, and how each feature lets go of it on
 * sign-out. Features register once at start-up (src/app/sign-out-steps.ts); signing out runs
 * every `send` first, while the session still works (queued work goes out under the right
 * person), then ends the session, then every `clear`. Nothing here knows any feature.
 */
export type SignOutStep = {
  name: string;
  /** Sends what the person still has queued. Resolves when done or given up (it must not hang). */
  send?: (personId: number) => Promise<void>;
  /** Forgets what the person left in this browser: caches, drafts, ticks. May be async; sign-out waits for it. */
  clear?: (personId: number) => void | Promise<void>;
};

const steps = new Map<string, SignOutStep>();

/** Registers a feature's step; registering a name again replaces it. */
export function onSignOut(step: SignOutStep): void {
  steps.set(step.name, step);
}

/** Longest wait for queued work before signing out anyway (what is left stays, under its person). */
export const sendBeforeSignOutMs = 5_000;

export async function sendBeforeSignOut(personId: number): Promise<void> {
  await Promise.all(
    [...steps.values()].map((step) =>
      step.send
        ? Promise.race([
            step.send(personId).catch(() => undefined),
            new Promise<void>((resolve) => setTimeout(resolve, sendBeforeSignOutMs)),
          ])
        : undefined,
    ),
  );
}

/** Longest wait for one feature's clearing (what it did not finish, sign-in clears again). */
export const clearAfterSignOutMs = 5_000;

/** Runs every `clear` together and resolves when all have finished (or failed, or run out of time). */
export async function clearAfterSignOut(personId: number): Promise<void> {
  await Promise.all(
    [...steps.values()].map(async (step) => {
      try {
        await Promise.race([
          step.clear?.(personId),
          new Promise<void>((resolve) => setTimeout(resolve, clearAfterSignOutMs)),
        ]);
      } catch {
        // One feature failing to clear must not keep the others' data.
      }
    }),
  );
}
