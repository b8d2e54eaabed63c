/** What every query function passes on to the API client: the signal that cancels it. */
export type Fetching = { signal?: AbortSignal };

/** A number or key as one segment of an API address, encoded: never trusted as typed. */
export const segment = (value: string | number): string => encodeURIComponent(String(value));
