// The people list's fetcher: src/lib/queries/people.ts.
export { getPeople } from '../../../lib/queries/people';
