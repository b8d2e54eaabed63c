import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { orderListQuerySchema, type OrderListQuery } from '../../../../shared/schemas/orders';

const defaults = { sort: 'createdAt', direction: 'desc', page: 1, pageSize: 25 } as const;
const keys = ['status', 'protocol', 'from', 'to', 'sort', 'direction', 'page', 'pageSize'] as const;

/** Reads one parameter with the API's own rule; a value the API would refuse is left out. */
function readParam<K extends (typeof keys)[number]>(search: URLSearchParams, key: K): OrderListQuery[K] | undefined {
  const raw = search.get(key);
  if (raw === null || raw === '') return undefined;
  const parsed = orderListQuerySchema.shape[key].safeParse(raw);
  return parsed.success ? (parsed.data as OrderListQuery[K]) : undefined;
}

/**
 * The orders table's filters, sort and page, kept in the address so that reload, the back button
 * and a shared link all show the same list.
 */
export function useOrderListParams() {
  const [search, setSearch] = useSearchParams();

  const query = useMemo<OrderListQuery>(() => {
    const q: OrderListQuery = { ...defaults };
    for (const key of keys) {
      const value = readParam(search, key);
      if (value !== undefined) Object.assign(q, { [key]: value });
    }
    return q;
  }, [search]);

  /** Changes some parameters; any change other than the page itself starts again at page 1. */
  const update = useCallback(
    (changes: Partial<OrderListQuery>) => {
      const next: OrderListQuery = { ...query, ...changes };
      if (!('page' in changes)) next.page = 1;
      const params = new URLSearchParams();
      for (const key of keys) {
        const value = next[key];
        if (value === undefined || value === '' || value === (defaults as Record<string, unknown>)[key]) continue;
        params.set(key, String(value));
      }
      setSearch(params);
    },
    [query, setSearch],
  );

  const filtered = query.status !== undefined || query.protocol !== undefined || query.from !== undefined || query.to !== undefined;
  return { query, update, filtered };
}
