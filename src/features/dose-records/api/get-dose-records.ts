import type { DoseRecordFilter } from '../../../../shared/schemas/reviews';
import { api } from '../../../lib/api-client';
import { searchOf } from '../../../lib/queries/request';
import { doseRecordPageSchema, type DoseRecordPage } from './dose-record-schemas';

/** The filter as URL search parameters; empty values are left out. */
export const doseRecordSearch = (filter: Partial<DoseRecordFilter>): string => searchOf(filter);

/** One page of finished sessions' dose records, filtered, sorted and paged by the server. */
export async function getDoseRecords(
  filter: DoseRecordFilter,
  { signal }: { signal?: AbortSignal } = {},
): Promise<DoseRecordPage> {
  return api.get(`/dose-records?${doseRecordSearch(filter)}`, {
    schema: doseRecordPageSchema,
    signal,
  });
}

/** The CSV of every record the filter matches, in the table's order; the server sends it as an attachment. */
export function doseRecordsCsvHref(filter: DoseRecordFilter): string {
  const { page: _page, pageSize: _pageSize, ...rest } = filter;
  const search = doseRecordSearch(rest);
  return `/api/exports/dose-records.csv${search ? `?${search}` : ''}`;
}
