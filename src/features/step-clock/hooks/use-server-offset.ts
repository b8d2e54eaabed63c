import { useSyncExternalStore } from 'react';
import { serverOffsetMs, subscribeServerOffset } from '../api/clock-offset';

/** Server clock minus this device's clock (ms), as last measured from a session answer. */
export function useServerOffsetMs(): number {
  return useSyncExternalStore(subscribeServerOffset, serverOffsetMs, serverOffsetMs);
}
