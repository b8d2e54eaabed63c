// Today is one cache for every screen that reads it: src/lib/queries/today.ts.
export type { Today, Worklist } from '../../../lib/queries/today';
