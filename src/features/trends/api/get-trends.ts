import { api } from '../../../lib/api-client';
import { trendsResponseSchema, type TrendsAnswer } from './trend-schemas';

/** Months as YYYY-MM; the API counts whole unit months, so a month is sent as its first day. */
export type TrendFilter = { from?: string; to?: string; protocol?: string };

/** Sessions and sessions with a deviation per unit month and protocol version, and the deviations by type and severity. */
export async function getTrends(
  filter: TrendFilter,
  { signal }: { signal?: AbortSignal } = {},
): Promise<TrendsAnswer> {
  const search = new URLSearchParams();
  if (filter.from) search.set('from', `${filter.from}-01`);
  if (filter.to) search.set('to', `${filter.to}-01`);
  if (filter.protocol) search.set('protocol', filter.protocol);
  const query = search.toString();
  return api.get(`/trends${query ? `?${query}` : ''}`, { schema: trendsResponseSchema, signal });
}
