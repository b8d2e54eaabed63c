import type { AuditFilter } from '../../../../shared/schemas/reviews';
import { api } from '../../../lib/api-client';
import { deviationPageSchema, type DeviationPage } from './deviation-schemas';

/** The filter as URL search parameters; empty values are left out. */
export function deviationSearch(filter: Partial<AuditFilter>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(filter)) {
    if (value !== undefined && value !== '') search.set(key, String(value));
  }
  return search.toString();
}

/** One page of the queue, filtered, sorted and paged by the server. */
export async function getDeviations(
  filter: AuditFilter,
  { signal }: { signal?: AbortSignal } = {},
): Promise<DeviationPage> {
  return api.get(`/deviations?${deviationSearch(filter)}`, { schema: deviationPageSchema, signal });
}

/**
 * The address of the CSV of every deviation the filter matches, in the table's order. The
 * server streams it as an attachment, so a plain link downloads it.
 */
export function deviationsCsvHref(filter: AuditFilter): string {
  const { page: _page, pageSize: _pageSize, ...rest } = filter;
  const search = deviationSearch(rest);
  return `/api/exports/deviations.csv${search ? `?${search}` : ''}`;
}
