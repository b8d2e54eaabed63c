import { z } from 'zod';
import { protocolKinds, protocolVersionSchema } from '../../../shared/protocol/protocol-schema';
import { roles } from '../../../shared/roles';

/** The shapes the protocol API answers with; the server builds them in server/protocols/service.ts. */

export const versionStatuses = ['draft', 'approved', 'retired', 'discarded'] as const;
export type VersionStatus = (typeof versionStatuses)[number];

export const versionOrigins = ['shipped', 'imported', 'cloned'] as const;
export type VersionOrigin = (typeof versionOrigins)[number];

export const approvalSchema = z.object({
  userId: z.number().int(),
  displayName: z.string().nullable(),
  approvedAs: z.enum(roles),
  approvedAt: z.string(),
  /** What the approver's signature meant (shared/protocol/approval-signature.ts); null on older approvals. */
  meaning: z.string().nullable().default(null),
});
export type VersionApproval = z.infer<typeof approvalSchema>;

export const versionSummarySchema = z.object({
  key: z.string(),
  version: z.number().int(),
  kind: z.enum(protocolKinds),
  title: z.string(),
  status: z.enum(versionStatuses),
  origin: z.enum(versionOrigins),
  sha256: z.string(),
  createdAt: z.string(),
  approvedAt: z.string().nullable(),
  retiredAt: z.string().nullable(),
  discardedAt: z.string().nullable().default(null),
  discardReason: z.string().nullable().default(null),
  /** The newer approved version that supersedes this approved one; null when it is the newest. */
  supersededBy: z.number().int().nullable().default(null),
  approvals: z.array(approvalSchema),
});
export type VersionSummary = z.infer<typeof versionSummarySchema>;

export const versionDetailSchema = versionSummarySchema.extend({
  sourceFile: z.string().nullable(),
  definition: protocolVersionSchema,
});
export type VersionDetail = z.infer<typeof versionDetailSchema>;

export const protocolSummarySchema = z.object({
  key: z.string(),
  kind: z.enum(protocolKinds),
  title: z.string(),
  versions: z.array(versionSummarySchema),
});
export type ProtocolSummary = z.infer<typeof protocolSummarySchema>;

export const versionResponseSchema = z.object({ version: versionDetailSchema });
