import type { AuditRepository } from './repository';

export function createAuditService(audit: AuditRepository) {
  return {
    /** Recomputes the hash chain over every audit row; names the first row that does not match. */
    verifyChain: () => audit.verifyChain(),
  };
}

export type AuditService = ReturnType<typeof createAuditService>;
