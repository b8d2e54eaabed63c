import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { doseRecordFilterSchema, type DoseRecordFilter } from '../../../../shared/schemas/reviews';

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

/** The dose records' filters, sort and page, kept in the address. */
export function useDoseRecordListParams() {
  const [search, setSearch] = useSearchParams();

  const filter = useMemo<DoseRecordFilter>(() => {
    const f: DoseRecordFilter = { ...defaults };
    for (const key of keys) {
      const value = readParam(search, key);
      if (value !== undefined) Object.assign(f, { [key]: value });
    }
    if (f.version !== undefined && f.protocol === undefined) f.version = undefined;
    return f;
  }, [search]);

  /** Changes some parameters; any change other than the page itself starts again at page 1. */
  const update = useCallback(
    (changes: Partial<DoseRecordFilter>) => {
      const next: DoseRecordFilter = { ...filter, ...changes };
      if (!('page' in changes)) next.page = 1;
      if ('protocol' in changes && !('version' in changes)) next.version = undefined;
      const out = new URLSearchParams();
      for (const key of keys) {
        const value = next[key];
        if (value === undefined || value === '' || value === (defaults as Record<string, unknown>)[key]) continue;
        out.set(key, String(value));
      }
      setSearch(out);
    },
    [filter, setSearch],
  );

  const filtered = filterKeys.some((key) => filter[key] !== undefined);
  return { filter, update, filtered };
}
