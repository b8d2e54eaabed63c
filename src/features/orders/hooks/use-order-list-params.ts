import { useCallback, useMemo } from 'react';
import { orderListQuerySchema, type OrderListQuery } from '../../../../shared/schemas/orders';
import { changedListParams, readListParams, writeListParams } from '../../../lib/list-params';
import { useLatestSearchParams } from '../../../lib/use-latest-search-params';

const defaults = { sort: 'createdAt', direction: 'desc', page: 1, pageSize: 25 } as const;
const keys = ['status', 'protocol', 'from', 'to', 'sort', 'direction', 'page', 'pageSize'] as const;

/** Reads one parameter with the API's own rule; a value the API would refuse is left out. */
function readParam<K extends (typeof keys)[number]>(
  search: URLSearchParams,
  key: K,
): OrderListQuery[K] | undefined {
  const raw = search.get(key);
  if (raw === null || raw === '') return undefined;
  const parsed = orderListQuerySchema.shape[key].safeParse(raw);
  return parsed.success ? (parsed.data as OrderListQuery[K]) : undefined;
}

function readQuery(search: URLSearchParams): OrderListQuery {
  return readListParams(search, defaults, keys, readParam);
}

/**
 * The orders table's filters, sort and page, kept in the address so that reload, the back button
 * and a shared link all show the same list.
 */
export function useOrderListParams() {
  const [search, changeSearch] = useLatestSearchParams();
  const query = useMemo(() => readQuery(search), [search]);

  /** Changes some parameters; any change other than the page itself starts again at page 1. */
  const update = useCallback(
    (changes: Partial<OrderListQuery>) =>
      changeSearch((latest) =>
        writeListParams(changedListParams(readQuery(latest), changes), keys, defaults),
      ),
    [changeSearch],
  );

  const filtered =
    query.status !== undefined ||
    query.protocol !== undefined ||
    query.from !== undefined ||
    query.to !== undefined;
  return { query, update, filtered };
}
