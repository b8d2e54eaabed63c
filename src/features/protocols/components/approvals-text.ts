import type { VersionSummary } from '../api/protocol-response-schemas';

/** Two different people approve a version made in Luxtempo (server/protocols/service.ts). */
export const approvalsNeeded = 2;

/** How far a version is through the two-person approval, in words. */
export function approvalsText(version: VersionSummary): string {
  if (version.origin === 'shipped') return 'Recorded in the shipped file';
  return `${version.approvals.length} of ${approvalsNeeded}`;
}
