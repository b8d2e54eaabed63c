import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { auditTrailQuerySchema, type AuditTrailQuery } from '../../../../shared/schemas/reviews';

const defaults = { direction: 'desc', page: 1, pageSize: 50 } as const;
const filterKeys = ['from', 'to', 'action', 'actor', 'entityType', 'entityId'] as const;
const keys = [...filterKeys, 'direction', 'page', 'pageSize'] as const;

function readParam(search: URLSearchParams, key: (typeof keys)[number]): unknown {
  const raw = search.get(key);
  if (raw === null || raw === '') return undefined;
  const parsed = auditTrailQuerySchema.shape[key].safeParse(raw);
  return parsed.success ? parsed.data : undefined;
}

/** The trail's filters and page, kept in the address. */
export function useAuditTrailParams() {
  const [search, setSearch] = useSearchParams();

  const query = useMemo<AuditTrailQuery>(() => {
    const q: AuditTrailQuery = { ...defaults };
    for (const key of keys) {
      const value = readParam(search, key);
      if (value !== undefined) Object.assign(q, { [key]: value });
    }
    return q;
  }, [search]);

  const update = useCallback(
    (changes: Partial<AuditTrailQuery>) => {
      const next: AuditTrailQuery = { ...query, ...changes };
      if (!('page' in changes)) next.page = 1;
      const out = new URLSearchParams();
      for (const key of keys) {
        const value = next[key];
        if (value === undefined || value === '' || value === (defaults as Record<string, unknown>)[key]) continue;
        out.set(key, String(value));
      }
      setSearch(out);
    },
    [query, setSearch],
  );

  return { query, update, filtered: filterKeys.some((key) => query[key] !== undefined) };
}
