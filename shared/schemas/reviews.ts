import { z } from 'zod';
import { deviationSeverities, deviationTypes } from '../session/session-events';

export const reviewStatuses = ['open', 'closed'] as const;
export type ReviewStatus = (typeof reviewStatuses)[number];

/** The auditor's judgement when closing a deviation. */
export const reviewClassifications = ['acceptable', 'needs-follow-up', 'incident'] as const;
export type ReviewClassification = (typeof reviewClassifications)[number];

const comment = z
  .string({ error: 'comment is required' })
  .trim()
  .min(3, 'comment must be 3 to 2000 characters')
  .max(2000, 'comment must be 3 to 2000 characters');

export const closeDeviationSchema = z.strictObject({
  classification: z.enum(reviewClassifications, {
    error: `classification must be one of ${reviewClassifications.join(', ')}`,
  }),
  comment,
});
export const reopenDeviationSchema = z.strictObject({ comment });

const date = (field: string) => z.iso.date({ error: `${field} must be a date (YYYY-MM-DD)` });
const page = {
  page: z.coerce
    .number({ error: 'page must be a whole number' })
    .int('page must be a whole number')
    .min(1, 'page must be 1 to 100000')
    .max(100000, 'page must be 1 to 100000')
    .default(1),
  pageSize: z.coerce
    .number({ error: 'pageSize must be a whole number' })
    .int('pageSize must be a whole number')
    .min(1, 'pageSize must be 1 to 200')
    .max(200, 'pageSize must be 1 to 200')
    .default(25),
  direction: z.enum(['asc', 'desc'], { error: 'direction must be asc or desc' }).default('desc'),
};

/** Filters shared by the deviations queue, the dose records and their CSV exports. */
export const auditFilterSchema = z.strictObject({
  from: date('from').optional(),
  to: date('to').optional(),
  protocol: z
    .string()
    .regex(/^[a-z0-9-]{1,64}$/, 'protocol must be a protocol key')
    .optional(),
  version: z.coerce
    .number({ error: 'version must be a whole number' })
    .int('version must be a whole number')
    .min(1, 'version must be 1 or more')
    .optional(),
  type: z
    .enum(deviationTypes, { error: `type must be one of ${deviationTypes.join(', ')}` })
    .optional(),
  severity: z
    .enum(deviationSeverities, {
      error: `severity must be one of ${deviationSeverities.join(', ')}`,
    })
    .optional(),
  status: z.enum(reviewStatuses, { error: 'status must be open or closed' }).optional(),
  staff: z.coerce
    .number({ error: 'staff must be a person id' })
    .int('staff must be a person id')
    .positive('staff must be a person id')
    .optional(),
  ...page,
  sort: z
    .enum(['detectedAt', 'severity', 'type', 'status'], {
      error: 'sort must be detectedAt, severity, type or status',
    })
    .default('detectedAt'),
});
export type AuditFilter = z.infer<typeof auditFilterSchema>;

export const doseRecordFilterSchema = auditFilterSchema
  .omit({ type: true, severity: true, status: true, sort: true })
  .extend({
    outcome: z
      .enum(['completed', 'stopped'], { error: 'outcome must be completed or stopped' })
      .optional(),
    sort: z
      .enum(['endedAt', 'fluence'], { error: 'sort must be endedAt or fluence' })
      .default('endedAt'),
  });
export type DoseRecordFilter = z.infer<typeof doseRecordFilterSchema>;

export const auditTrailQuerySchema = z.strictObject({
  from: date('from').optional(),
  to: date('to').optional(),
  action: z
    .string()
    .regex(/^[a-z0-9.-]{1,64}$/, 'action must be an action name such as order.signed')
    .optional(),
  actor: z.coerce
    .number({ error: 'actor must be a person id' })
    .int()
    .positive('actor must be a person id')
    .optional(),
  entityType: z
    .string()
    .regex(/^[a-z_]{1,64}$/, 'entityType must be a record type such as order')
    .optional(),
  entityId: z
    .string()
    .regex(/^[0-9]{1,20}$/, 'entityId must be a number')
    .optional(),
  ...page,
});
export type AuditTrailQuery = z.infer<typeof auditTrailQuerySchema>;
