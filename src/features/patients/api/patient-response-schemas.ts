import { z } from 'zod';
import { orderStatuses } from '../../../../shared/schemas/orders';
import { eyes, patientSchema } from '../../../../shared/schemas/patients';

/** The shapes the patient API answers with; the server builds them in server/patients/service.ts. */

export const treatmentSchema = z.object({
  orderId: z.number(),
  revision: z.number(),
  eye: z.enum(eyes),
  kind: z.enum(['pdt', 'cxl']),
  protocol: z.object({ key: z.string(), version: z.number(), title: z.string() }),
  status: z.enum(orderStatuses),
  /** When the order was signed, or created if it never was (UTC, ISO 8601). */
  date: z.string(),
  daysSincePreviousSameKind: z.number().nullable(),
});
export type Treatment = z.infer<typeof treatmentSchema>;

export const patientHistorySchema = z.object({
  patient: patientSchema,
  eyes: z.object({ right: z.array(treatmentSchema), left: z.array(treatmentSchema) }),
});
export type PatientHistory = z.infer<typeof patientHistorySchema>;
