import { useCallback, useMemo } from 'react';
import { auditFilterSchema, type AuditFilter } from '../../../../shared/schemas/reviews';
import { changedListParams, readListParams, writeListParams } from '../../../lib/list-params';
import { useLatestSearchParams } from '../../../lib/use-latest-search-params';

/**
 * The queue shows open deviations unless asked otherwise, so "any status" needs a value of its
 * own in the address; the API knows only open and closed.
 */
export type StatusChoice = 'open' | 'closed' | 'any';
export type DeviationListParams = Omit<AuditFilter, 'status'> & { status: StatusChoice };

const defaults = {
  status: 'open',
  sort: 'detectedAt',
  direction: 'desc',
  page: 1,
  pageSize: 25,
} as const;
const filterKeys = ['from', 'to', 'protocol', 'version', 'type', 'severity', 'staff'] as const;
const keys = [...filterKeys, 'status', 'sort', 'direction', 'page', 'pageSize'] as const;
type Key = (typeof keys)[number];

/** Reads one parameter by the API's own rule; a value the API would refuse is left out. */
function readParam(search: URLSearchParams, key: Key): unknown {
  const raw = search.get(key);
  if (raw === null || raw === '') return undefined;
  if (key === 'status')
    return raw === 'open' || raw === 'closed' || raw === 'any' ? raw : undefined;
  const parsed = auditFilterSchema.shape[key].safeParse(raw);
  return parsed.success ? parsed.data : undefined;
}

/** The filter the API is asked for. */
export function toAuditFilter({ status, ...rest }: DeviationListParams): AuditFilter {
  return { ...rest, status: status === 'any' ? undefined : status };
}

function readParams(search: URLSearchParams): DeviationListParams {
  const p: DeviationListParams = readListParams(search, defaults, keys, readParam);
  // A version means nothing without its protocol.
  if (p.version !== undefined && p.protocol === undefined) p.version = undefined;
  return p;
}

/**
 * The queue's filters, sort and page, kept in the address so that reload, the back button and a
 * shared link all show the same queue.
 */
export function useDeviationListParams() {
  const [search, changeSearch] = useLatestSearchParams();
  const params = useMemo(() => readParams(search), [search]);

  /** Changes some parameters; any change other than the page itself starts again at page 1. */
  const update = useCallback(
    (changes: Partial<DeviationListParams>) =>
      changeSearch((latest) => {
        const next = changedListParams(readParams(latest), changes);
        if ('protocol' in changes && !('version' in changes)) next.version = undefined;
        return writeListParams(next, keys, defaults);
      }),
    [changeSearch],
  );

  const filtered =
    filterKeys.some((key) => params[key] !== undefined) || params.status !== defaults.status;
  return { params, update, filtered, search: search.toString() };
}
