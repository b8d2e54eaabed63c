import { useCallback, useMemo } from 'react';
import { auditTrailQuerySchema, type AuditTrailQuery } from '../../../../shared/schemas/reviews';
import { changedListParams, readListParams, writeListParams } from '../../../lib/list-params';
import { useLatestSearchParams } from '../../../lib/use-latest-search-params';

const defaults = { direction: 'desc', page: 1, pageSize: 50 } as const;
const filterKeys = ['from', 'to', 'action', 'actor', 'entityType', 'entityId'] as const;
const keys = [...filterKeys, 'direction', 'page', 'pageSize'] as const;

function readParam(search: URLSearchParams, key: (typeof keys)[number]): unknown {
  const raw = search.get(key);
  if (raw === null || raw === '') return undefined;
  const parsed = auditTrailQuerySchema.shape[key].safeParse(raw);
  return parsed.success ? parsed.data : undefined;
}

function readQuery(search: URLSearchParams): AuditTrailQuery {
  return readListParams(search, defaults, keys, readParam);
}

/** The trail's filters and page, kept in the address. */
export function useAuditTrailParams() {
  const [search, changeSearch] = useLatestSearchParams();
  const query = useMemo(() => readQuery(search), [search]);

  const update = useCallback(
    (changes: Partial<AuditTrailQuery>) =>
      changeSearch((latest) =>
        writeListParams(changedListParams(readQuery(latest), changes), keys, defaults),
      ),
    [changeSearch],
  );

  return { query, update, filtered: filterKeys.some((key) => query[key] !== undefined) };
}
