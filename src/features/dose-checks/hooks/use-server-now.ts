import { useQuery } from '@tanstack/react-query';
import { useServerNowMs } from '../../../lib/server-now';
import { doseCheckQueries } from '../api/dose-check-queries';

/** Server clock minus this device's clock, in ms, from /api/today (0 until it has answered). */
export function useClockOffsetMs(): number {
  return useQuery(doseCheckQueries.worklists()).data?.clockOffsetMs ?? 0;
}

/** The server's "now" in ms, re-read every second, by Today's measure of the clock offset. */
export function usePharmacyNowMs(): number {
  return useServerNowMs(useClockOffsetMs());
}
