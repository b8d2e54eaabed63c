import { useCallback, useMemo } from 'react';
import { doseRecordFilterSchema, type DoseRecordFilter } from '../../../../shared/schemas/reviews';
import { changedListParams, readListParams, writeListParams } from '../../../lib/list-params';
import { useLatestSearchParams } from '../../../lib/use-latest-search-params';

const defaults = { sort: 'endedAt', direction: 'desc', page: 1, pageSize: 25 } as const;
const filterKeys = ['from', 'to', 'protocol', 'version', 'outcome', 'staff'] as const;
const keys = [...filterKeys, 'sort', 'direction', 'page', 'pageSize'] as const;

/** Reads one parameter by the API's own rule; a value the API would refuse is left out. */
function readParam(search: URLSearchParams, key: (typeof keys)[number]): unknown {
  const raw = search.get(key);
  if (raw === null || raw === '') return undefined;
  const parsed = doseRecordFilterSchema.shape[key].safeParse(raw);
  return parsed.success ? parsed.data : undefined;
}

function readFilter(search: URLSearchParams): DoseRecordFilter {
  const f: DoseRecordFilter = readListParams(search, defaults, keys, readParam);
  if (f.version !== undefined && f.protocol === undefined) f.version = undefined;
  return f;
}

/** The dose records' filters, sort and page, kept in the address. */
export function useDoseRecordListParams() {
  const [search, changeSearch] = useLatestSearchParams();
  const filter = useMemo(() => readFilter(search), [search]);

  /** Changes some parameters; any change other than the page itself starts again at page 1. */
  const update = useCallback(
    (changes: Partial<DoseRecordFilter>) =>
      changeSearch((latest) => {
        const next = changedListParams(readFilter(latest), changes);
        if ('protocol' in changes && !('version' in changes)) next.version = undefined;
        return writeListParams(next, keys, defaults);
      }),
    [changeSearch],
  );

  const filtered = filterKeys.some((key) => filter[key] !== undefined);
  return { filter, update, filtered };
}
