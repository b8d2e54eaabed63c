import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { TrendFilter } from '../api/get-trends';

const month = /^\d{4}-(0[1-9]|1[0-2])$/;
const protocolKey = /^[a-z0-9-]{1,64}$/;

/** The chart's months and protocol, kept in the address. A value the API would refuse is left out. */
export function useTrendParams() {
  const [search, setSearch] = useSearchParams();
  const filter = useMemo<TrendFilter>(() => {
    const read = (key: string, rule: RegExp) => {
      const value = search.get(key);
      return value && rule.test(value) ? value : undefined;
    };
    return { from: read('from', month), to: read('to', month), protocol: read('protocol', protocolKey) };
  }, [search]);

  const update = useCallback(
    (changes: Partial<TrendFilter>) => {
      const next = { ...filter, ...changes };
      const out = new URLSearchParams();
      for (const key of ['from', 'to', 'protocol'] as const) if (next[key]) out.set(key, next[key]);
      setSearch(out);
    },
    [filter, setSearch],
  );

  return { filter, update, filtered: Boolean(filter.from || filter.to || filter.protocol) };
}

export const monthPattern = month;
