import { z } from 'zod';

export const auditEventSchema = z.object({
  id: z.string(),
  occurredAt: z.string(),
  action: z.string(),
  entityType: z.string().nullable(),
  entityId: z.union([z.string(), z.number()]).nullable(),
  actorUserId: z.number().int().nullable(),
  actor: z.string().nullable(),
  ipAddress: z.string().nullable(),
  details: z.unknown(),
});
export type AuditEvent = z.infer<typeof auditEventSchema>;

export const auditEventPageSchema = z.object({
  events: z.array(auditEventSchema),
  total: z.number().int(),
});
export type AuditEventPage = z.infer<typeof auditEventPageSchema>;
