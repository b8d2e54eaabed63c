import { useCallback, useMemo } from 'react';
import { writeListParams } from '../../../lib/list-params';
import { useLatestSearchParams } from '../../../lib/use-latest-search-params';
import type { TrendFilter } from '../api/get-trends';

const month = /^\d{4}-(0[1-9]|1[0-2])$/;
const protocolKey = /^[a-z0-9-]{1,64}$/;
const keys = ['from', 'to', 'protocol'] as const;

function readFilter(search: URLSearchParams): TrendFilter {
  const read = (key: string, rule: RegExp) => {
    const value = search.get(key);
    return value && rule.test(value) ? value : undefined;
  };
  return {
    from: read('from', month),
    to: read('to', month),
    protocol: read('protocol', protocolKey),
  };
}

/** The chart's months and protocol, kept in the address. A value the API would refuse is left out. */
export function useTrendParams() {
  const [search, changeSearch] = useLatestSearchParams();
  const filter = useMemo(() => readFilter(search), [search]);

  const update = useCallback(
    (changes: Partial<TrendFilter>) =>
      changeSearch((latest) => writeListParams({ ...readFilter(latest), ...changes }, keys)),
    [changeSearch],
  );

  return { filter, update, filtered: Boolean(filter.from || filter.to || filter.protocol) };
}

export const monthPattern = month;
