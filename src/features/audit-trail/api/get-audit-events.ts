import type { AuditTrailQuery } from '../../../../shared/schemas/reviews';
import { api } from '../../../lib/api-client';
import { searchOf } from '../../../lib/queries/request';
import { auditEventPageSchema, type AuditEventPage } from './audit-event-schemas';

/** One page of the audit trail, filtered and paged by the server. */
export async function getAuditEvents(
  query: AuditTrailQuery,
  { signal }: { signal?: AbortSignal } = {},
): Promise<AuditEventPage> {
  return api.get(`/audit-events?${searchOf(query)}`, { schema: auditEventPageSchema, signal });
}
