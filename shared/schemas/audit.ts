import { z } from 'zod';

/** The result of checking the audit trail's hash chain (`npm run audit:verify`, `GET /api/audit-chain`). */
export const auditChainReportSchema = z.object({
  ok: z.boolean(),
  /** Rows found intact before the first break (all rows when ok). */
  checked: z.number().int().min(0),
  /** The id of the first row that does not match, or null (ok, or only the head is off). */
  firstBrokenId: z.string().nullable(),
  reason: z.string().nullable(),
});
export type AuditChainReport = z.infer<typeof auditChainReportSchema>;
