import { usePharmacyNowMs } from '../hooks/use-server-now';
import { BeyondUseCountdown } from './beyond-use-countdown';

/** The countdown with its own once-a-second clock, so only it re-renders as time passes. */
export function LiveBeyondUseCountdown({ beyondUseAt }: { beyondUseAt: string }) {
  const nowMs = usePharmacyNowMs();
  return <BeyondUseCountdown beyondUseAt={beyondUseAt} nowMs={nowMs} />;
}
