import type { FhirBundle } from '../../shared/fhir/treatment-bundle';
import { FhirAnswerError } from '../../shared/fhir/patient-from-fhir';
import type { Clock } from '../clock';
import { pollingWorker, retryDelayS } from '../mail/outbox';
import type { FhirGateway } from './client';
import type { FhirRepository } from './repository';

const leaseS = 120;

/**
 * Sends due treatment bundles to the FHIR server, like the mail outbox: claimed under SKIP LOCKED
 * with a lease (several instances never send one twice), retried with the same back-off for as
 * long as the server is down or answers nonsense. Only a 4xx answer (the server refuses this
 * bundle) marks the row failed, with the reason, for a person to look at.
 */
export function createFhirDeliveryWorker(
  fhir: FhirRepository,
  gateway: FhirGateway,
  clock: Clock,
  options: { intervalMs?: number; batchSize?: number } = {},
) {
  async function runOnce(): Promise<number> {
    const batch = await fhir.claimDue(options.batchSize ?? 10, leaseS);
    let sent = 0;
    for (const row of batch) {
      const attempts = row.attempts + 1;
      try {
        await gateway.sendTransaction(row.bundle as unknown as FhirBundle);
        await fhir.update(row.id, {
          status: 'sent',
          attempts,
          sentAt: clock.now(),
          lastError: null,
        });
        sent++;
      } catch (error) {
        const status = (error as { status?: number | null }).status ?? null;
        // Only the server's own refusal of this bundle is final; silence, 5xx and nonsense are retried.
        const permanent =
          !(error instanceof FhirAnswerError) &&
          status !== null &&
          status >= 400 &&
          status < 500 &&
          status !== 408 &&
          status !== 429;
        await fhir.update(row.id, {
          status: permanent ? 'failed' : 'pending',
          attempts,
          lastError: String((error as Error).message ?? error).slice(0, 500),
          nextAttemptAt: new Date(clock.now().getTime() + retryDelayS(attempts) * 1000),
        });
      }
    }
    return sent;
  }

  return pollingWorker(runOnce, 'FHIR outbox worker', options.intervalMs ?? 3000);
}

export type FhirDeliveryWorker = ReturnType<typeof createFhirDeliveryWorker>;
