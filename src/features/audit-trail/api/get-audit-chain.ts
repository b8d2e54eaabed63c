import { auditChainReportSchema, type AuditChainReport } from '../../../../shared/schemas/audit';
import { api } from '../../../lib/api-client';

/** Asks the server to recompute the audit trail's hash chain. */
export function getAuditChain(): Promise<AuditChainReport> {
  return api.get('/audit-chain', { schema: auditChainReportSchema });
}
