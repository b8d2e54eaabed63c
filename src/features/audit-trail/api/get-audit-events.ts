import type { AuditTrailQuery } from '../../../../shared/schemas/reviews';
import { api } from '../../../lib/api-client';
import { auditEventPageSchema, type AuditEventPage } from './audit-event-schemas';

/** One page of the audit trail, filtered and paged by the server. */
export async function getAuditEvents(
  query: AuditTrailQuery,
  { signal }: { signal?: AbortSignal } = {},
): Promise<AuditEventPage> {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value !== undefined && value !== '') search.set(key, String(value));
  }
  return api.get(`/audit-events?${search.toString()}`, { schema: auditEventPageSchema, signal });
}
