/** What every query function passes on to the API client: the signal that cancels it. */
export type Fetching = { signal?: AbortSignal };

/** A number or key as one segment of an API address, encoded: never trusted as typed. */
export const segment = (value: string | number): string => encodeURIComponent(String(value));

/** A filter as URL search parameters for the API; unset and empty values are left out. */
export function searchOf(filter: object): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(filter)) {
    if (value !== undefined && value !== '') search.set(key, String(value));
  }
  return search.toString();
}
