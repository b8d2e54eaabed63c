import { z } from 'zod';
import { calculationRequestSchema, dosePlanSchema, planInputsSchema } from './calculation';
import { eyes, patientSchema } from './patients';

/**
 * An order's life. PDT: draft → signed → checked → prepared → in-session → completed | stopped
 * → reviewed. A protocol with no drug (CXL) goes from draft straight to ready. A twice-refused
 * dose check sends the order back (returned); an amendment supersedes the revision it replaces.
 * An order not yet in a session may be cancelled, with a reason.
 */
export const orderStatuses = [
  'draft',
  'signed',
  'returned',
  'checked',
  'prepared',
  'ready',
  'in-session',
  'completed',
  'stopped',
  'reviewed',
  'superseded',
  'cancelled',
] as const;
export type OrderStatus = (typeof orderStatuses)[number];

const reason = (field: string) =>
  z
    .string({ error: `${field} is required` })
    .trim()
    .min(5, `${field} must be 5 to 500 characters`)
    .max(500, `${field} must be 5 to 500 characters`);

export const checklistAnswerSchema = z.strictObject({
  id: z.string({ error: 'checklist[].id is required' }).min(1).max(64),
  answer: z.enum(['yes', 'no'], { error: 'checklist[].answer must be yes or no' }),
  /** Needed to go on when the answer is yes: why treatment is still right. */
  overrideReason: reason('checklist[].overrideReason').optional(),
});
export type ChecklistAnswer = z.infer<typeof checklistAnswerSchema>;

export const orderDraftSchema = z.strictObject({
  patientId: z
    .number({ error: 'patientId must be a whole number' })
    .int('patientId must be a whole number')
    .positive('patientId must be 1 or more'),
  eye: z.enum(eyes, { error: 'eye must be right or left' }),
  protocol: calculationRequestSchema.shape.protocol,
  inputs: planInputsSchema,
  checklist: z
    .array(checklistAnswerSchema)
    .max(50, 'checklist can hold at most 50 answers')
    .default([]),
  /** A reason for each soft-limit warning, keyed by the warning's field (e.g. inputs.weight.value). */
  softLimitReasons: z.record(z.string().max(100), reason('softLimitReasons[field]')).default({}),
  /** Needed when this eye had the same kind of treatment within the protocol's minimum interval. */
  retreatmentReason: reason('retreatmentReason').nullable().optional(),
  /** Needed when the weight differs from the patient's last recorded weight beyond the unit's rule. */
  weightChangeReason: reason('weightChangeReason').nullable().optional(),
  /** Needed when the protocol version chosen has been superseded by a newer approved version. */
  supersededVersionReason: reason('supersededVersionReason').nullable().optional(),
  /**
   * Needed when the patient has another open order for the same eye and kind of treatment: why a
   * second one is right (a reason of substance, shared/orders/reason-of-substance.ts).
   */
  duplicateOrderReason: z
    .string()
    .trim()
    .max(500, 'duplicateOrderReason must be at most 500 characters')
    .nullable()
    .optional(),
  note: z.string().trim().max(2000, 'note must be at most 2000 characters').nullable().optional(),
  /** CXL with a swelling step: the clinician acknowledges that a stroma below the minimum is swollen before UV. */
  swellingAcknowledged: z
    .boolean({ error: 'swellingAcknowledged must be true or false' })
    .default(false),
});
export type OrderDraft = z.infer<typeof orderDraftSchema>;

/**
 * The order's row version as the client read it (`version` in the order's detail). An edit, a
 * signature or an amendment made from an older read is refused (409): nobody signs or overwrites
 * what they have not seen.
 */
export const orderVersionSchema = z
  .number({
    error: 'version must be the version of the order you read (a whole number of 1 or more)',
  })
  .int('version must be the version of the order you read (a whole number of 1 or more)')
  .positive('version must be the version of the order you read (a whole number of 1 or more)');

/** PUT /orders/:id: the draft's new content and the version it was read at. */
export const updateOrderSchema = orderDraftSchema.safeExtend({ version: orderVersionSchema });

export const signOrderSchema = z.strictObject({
  password: z
    .string({ error: 'password is required' })
    .min(1, 'password is required')
    .max(200, 'password must be at most 200 characters'),
  meaning: z.literal('ordered', { error: 'meaning must be "ordered"' }),
  version: orderVersionSchema,
});

/** POST /orders/:id/cancellation: why, and the version of the order read. */
export const cancelOrderSchema = z.strictObject({
  reason: z
    .string({ error: 'reason is required' })
    .trim()
    .max(500, 'reason must be at most 500 characters'),
  version: orderVersionSchema,
});

/**
 * GET /orders/signing-facts: what the server knows about the patient's other orders that a
 * signature of a new order would be held to, so the form can show it before saving.
 */
export const signingFactsQuerySchema = z.strictObject({
  patientId: z.coerce
    .number({ error: 'patientId must be a whole number' })
    .int('patientId must be a whole number')
    .positive('patientId must be 1 or more'),
  eye: z.enum(eyes, { error: 'eye must be right or left' }),
  protocol: z.string().regex(/^[a-z0-9-]{1,64}$/, 'protocol must be a protocol key'),
  version: z.coerce
    .number({ error: 'version must be a whole number' })
    .int('version must be a whole number')
    .positive('version must be 1 or more'),
  /** The order being edited or amended: it and the revision it replaces are not "other" orders. */
  orderId: z.coerce.number().int().positive('orderId must be 1 or more').optional(),
});
export type SigningFactsQuery = z.infer<typeof signingFactsQuerySchema>;

export const amendOrderSchema = orderDraftSchema.safeExtend({
  amendmentReason: reason('amendmentReason'),
});
export type AmendOrder = z.infer<typeof amendOrderSchema>;

/** POST /orders/:id/amendments: the amendment and the version of the signed order it amends. */
export const amendOrderRequestSchema = amendOrderSchema.safeExtend({ version: orderVersionSchema });

const measured = (field: string, unit: string, max: number) =>
  z
    .number({ error: `${field} must be a number in ${unit}` })
    .positive(`${field} must be greater than 0 ${unit}`)
    .max(max, `${field} must be at most ${max} ${unit}`);

export const doseCheckSchema = z.strictObject({
  bsaM2: measured('bsaM2', 'm²', 5),
  doseMg: measured('doseMg', 'mg', 100),
  drugVolumeMl: measured('drugVolumeMl', 'mL', 100),
  comment: z
    .string()
    .trim()
    .max(1000, 'comment must be at most 1000 characters')
    .nullable()
    .optional(),
});
export type DoseCheckEntry = z.infer<typeof doseCheckSchema>;

export const preparationSchema = z.strictObject({
  /** The stock lot to issue from; left out with no vialLot, the lot that expires first is picked. */
  stockLotId: z
    .number({ error: 'stockLotId must be a stock lot number' })
    .int('stockLotId must be a stock lot number')
    .positive('stockLotId must be a stock lot number')
    .optional(),
  /** A lot typed by hand: issued from stock when the unit holds it, else recorded as outside stock. */
  vialLot: z
    .string({ error: 'vialLot must be text' })
    .trim()
    .regex(
      /^[A-Za-z0-9][A-Za-z0-9 ./-]{1,39}$/,
      'vialLot must be 2 to 40 letters, digits, spaces, dots, slashes or hyphens',
    )
    .optional(),
  vialExpiry: z.iso.date({ error: 'vialExpiry must be a date (YYYY-MM-DD)' }).optional(),
  /** Vials opened for this dose; fewer than the plan's only where vial sharing is allowed. */
  vialsOpened: z
    .number({ error: 'vialsOpened must be a whole number from 0 to 10' })
    .int('vialsOpened must be a whole number from 0 to 10')
    .min(0, 'vialsOpened must be a whole number from 0 to 10')
    .max(10, 'vialsOpened must be a whole number from 0 to 10')
    .optional(),
  /** Drug discarded after drawing; left out, what the opened vials hold beyond the dose. */
  discardedMg: z
    .number({ error: 'discardedMg must be a number of mg from 0 to 150' })
    .min(0, 'discardedMg must be a number of mg from 0 to 150')
    .max(150, 'discardedMg must be a number of mg from 0 to 150')
    .optional(),
  discardReason: z
    .string({ error: 'discardReason must be text' })
    .trim()
    .min(3, 'discardReason must be 3 to 500 characters')
    .max(500, 'discardReason must be 3 to 500 characters')
    .optional(),
  /** When the powder was reconstituted; left out, now. */
  reconstitutedAt: z.iso
    .datetime({ offset: true, error: 'reconstitutedAt must be an ISO 8601 date-time with offset' })
    .optional(),
  volumeDrawnMl: measured('volumeDrawnMl', 'mL', 100),
});
export type PreparationEntry = z.infer<typeof preparationSchema>;

export const orderListQuerySchema = z.strictObject({
  status: z
    .enum(orderStatuses, { error: `status must be one of ${orderStatuses.join(', ')}` })
    .optional(),
  protocol: z
    .string()
    .regex(/^[a-z0-9-]{1,64}$/, 'protocol must be a protocol key')
    .optional(),
  from: z.iso.date({ error: 'from must be a date (YYYY-MM-DD)' }).optional(),
  to: z.iso.date({ error: 'to must be a date (YYYY-MM-DD)' }).optional(),
  patientId: z.coerce.number().int().positive('patientId must be 1 or more').optional(),
  sort: z
    .enum(['createdAt', 'status', 'protocol', 'patient'], {
      error: 'sort must be createdAt, status, protocol or patient',
    })
    .default('createdAt'),
  direction: z.enum(['asc', 'desc'], { error: 'direction must be asc or desc' }).default('desc'),
  page: z.coerce
    .number({ error: 'page must be a whole number' })
    .int('page must be a whole number')
    .min(1, 'page must be 1 or more')
    .max(100000, 'page must be at most 100000')
    .default(1),
  pageSize: z.coerce
    .number({ error: 'pageSize must be a whole number' })
    .int('pageSize must be a whole number')
    .min(1, 'pageSize must be 1 to 100')
    .max(100, 'pageSize must be 1 to 100')
    .default(25),
});
export type OrderListQuery = z.infer<typeof orderListQuerySchema>;

const person = z.object({ id: z.number(), displayName: z.string() }).nullable();

export const orderSummarySchema = z.object({
  id: z.number(),
  revision: z.number(),
  status: z.enum(orderStatuses),
  eye: z.enum(eyes),
  kind: z.enum(['pdt', 'cxl']),
  protocol: z.object({ key: z.string(), version: z.number(), title: z.string() }),
  patient: patientSchema.pick({ id: true, recordNumber: true, givenName: true, familyName: true }),
  createdAt: z.string(),
  signedAt: z.string().nullable(),
  beyondUseAt: z.string().nullable(),
  createdBy: person,
  signedBy: person,
});
export type OrderSummary = z.infer<typeof orderSummarySchema>;

/**
 * GET /orders/cancellable: an order not yet in its session, with only what identifies it. It is
 * what an administrator (who may cancel but not read orders) is shown: no figures, no answers.
 */
export const cancellableOrderSchema = z.object({
  id: z.number(),
  /** The row version: send it back with the cancellation. */
  version: z.number(),
  eye: z.enum(eyes),
  kind: z.enum(['pdt', 'cxl']),
  patient: patientSchema.pick({ recordNumber: true, givenName: true, familyName: true }),
  createdAt: z.string(),
  signedAt: z.string().nullable(),
  createdBy: person,
  signedBy: person,
});
export type CancellableOrder = z.infer<typeof cancellableOrderSchema>;
export const cancellableOrdersResponseSchema = z.object({
  orders: z.array(cancellableOrderSchema),
});

/** What a cancellation answers to someone who may cancel orders but not read them. */
export const cancelledOrderNoticeSchema = z.object({
  id: z.number(),
  status: z.literal('cancelled'),
  version: z.number(),
});

export const orderDetailSchema = orderSummarySchema.extend({
  /** The row version: send it back with an edit, a signature or an amendment. */
  version: z.number(),
  /** The date of birth too: the signature dialog and the printed order confirm identity with it. */
  patient: patientSchema.pick({
    id: true,
    recordNumber: true,
    givenName: true,
    familyName: true,
    dateOfBirth: true,
  }),
  inputs: planInputsSchema,
  checklist: z.array(checklistAnswerSchema),
  softLimitReasons: z.record(z.string(), z.string()),
  retreatmentReason: z.string().nullable(),
  weightChangeReason: z.string().nullable(),
  supersededVersionReason: z.string().nullable().default(null),
  duplicateOrderReason: z.string().nullable().default(null),
  note: z.string().nullable(),
  swellingAcknowledged: z.boolean().default(false),
  /** Who cancelled the order, when and why; null while it is not cancelled. */
  cancellation: z
    .object({ at: z.string(), by: person, reason: z.string() })
    .nullable()
    .default(null),
  /** Cautions answered yes, with the clinician's reason: the standing banner on every later screen. */
  answeredCautions: z
    .array(z.object({ id: z.string(), question: z.string(), reason: z.string() }))
    .default([]),
  /** The frozen dose plan; withheld (null) from a pharmacist until their blind check matches. */
  plan: dosePlanSchema.nullable(),
  planWithheld: z.boolean(),
  amendmentReason: z.string().nullable(),
  previousRevisionId: z.number().nullable(),
  nextRevisionId: z.number().nullable(),
  returnComment: z.string().nullable(),
  attachments: z.array(
    z.object({
      id: z.number(),
      fileName: z.string(),
      mimeType: z.string(),
      sizeBytes: z.number(),
      sha256: z.string(),
      createdAt: z.string(),
    }),
  ),
  doseChecks: z.array(
    z.object({
      id: z.number(),
      outcome: z.enum(['match', 'mismatch']),
      pharmacist: person,
      createdAt: z.string(),
      entered: z.object({ bsaM2: z.number(), doseMg: z.number(), drugVolumeMl: z.number() }),
      differing: z.array(z.string()),
      comment: z.string().nullable(),
    }),
  ),
  preparation: z
    .object({
      vialLot: z.string(),
      vialExpiry: z.string(),
      reconstitutedAt: z.string(),
      volumeDrawnMl: z.number(),
      beyondUseAt: z.string(),
      pharmacist: person,
    })
    .nullable(),
  warnings: z.array(
    z.object({ code: z.string(), message: z.string(), field: z.string().optional() }),
  ),
  /**
   * A draft's: what its signature would refuse now (shared/orders/readiness.ts, with the
   * server's facts about the patient's other orders and weights); null for a signed order.
   */
  beforeSigning: z
    .array(z.object({ path: z.string(), message: z.string() }))
    .nullable()
    .default(null),
});
export type OrderDetail = z.infer<typeof orderDetailSchema>;

/** Another open order of the same patient, eye and kind: what a second order must give a reason for. */
export const openOrderFactSchema = z.object({
  id: z.number(),
  revision: z.number(),
  status: z.enum(orderStatuses),
  protocolTitle: z.string(),
  createdAt: z.string(),
});
export type OpenOrderFact = z.infer<typeof openOrderFactSchema>;

export const signingFactsSchema = z.object({
  /** Days since this eye's last treatment of the same kind, when inside the protocol's interval. */
  recentTreatmentDays: z.number().nullable(),
  openOrders: z.array(openOrderFactSchema),
});
export type SigningFacts = z.infer<typeof signingFactsSchema>;
