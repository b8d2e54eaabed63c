import { api } from '../../../lib/api-client';
import { dischargeEmailResponseSchema } from './discharge-schemas';

/**
 * Puts the discharge advice in the outbox for the patient (202). The server refuses with 409
 * `no_email_consent` when the patient has not agreed to e-mail or has no address.
 */
export async function emailDischarge(orderId: number): Promise<{ queued: true }> {
  return api.post(`/orders/${encodeURIComponent(String(orderId))}/discharge-email`, undefined, {
    schema: dischargeEmailResponseSchema,
  });
}
