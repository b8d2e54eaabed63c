/**
 * The message the page sends a waiting service worker (src/sw.ts) to let it take over. A module
 * of its own so the worker's bundle takes nothing else of the page's code with it.
 */
export const takeOverMessage = { type: 'luxtempo-take-over' } as const;
