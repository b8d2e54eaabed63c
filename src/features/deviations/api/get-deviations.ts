// The deviation queue's fetchers: src/lib/queries/deviations.ts.
export { deviationSearch, deviationsCsvHref, getDeviations } from '../../../lib/queries/deviations';
