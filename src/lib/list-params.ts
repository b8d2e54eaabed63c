/**
 * A list's parameters read from the address, starting from the defaults; `readOne` gives
 * undefined for a parameter that is missing or that the API would refuse.
 */
export function readListParams<T extends object, K extends string>(
  search: URLSearchParams,
  defaults: T,
  keys: readonly K[],
  readOne: (search: URLSearchParams, key: K) => unknown,
): T {
  const params = { ...defaults };
  for (const key of keys) {
    const value = readOne(search, key);
    if (value !== undefined) Object.assign(params, { [key]: value });
  }
  return params;
}

/**
 * A list's parameters as search params. Unset, empty and default values are left out, so the
 * address shows only what the person chose.
 */
export function writeListParams<K extends string>(
  values: Partial<Record<K, unknown>>,
  keys: readonly K[],
  defaults: Partial<Record<K, unknown>> = {},
): URLSearchParams {
  const out = new URLSearchParams();
  for (const key of keys) {
    const value = values[key];
    if (value === undefined || value === '' || value === defaults[key]) continue;
    out.set(key, String(value));
  }
  return out;
}

/**
 * A paged list's parameters after a change. Any change other than the page itself starts again
 * at page 1, since the page shown may not exist in the new results.
 */
export function changedListParams<T extends { page: number }>(current: T, changes: Partial<T>): T {
  return { ...current, ...changes, ...('page' in changes ? {} : { page: 1 }) };
}
