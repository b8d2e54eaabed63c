import { z } from 'zod';
import { eyes } from './patients';

const clockTime = /^([01]\d|2[0-3]):[0-5]\d$/;

/** A treatment list: one room (and, if named, one device) on one day, cut into equal slots. */
export const createListSchema = z
  .strictObject({
    listDate: z.iso.date({ error: 'listDate must be a date (YYYY-MM-DD)' }),
    room: z
      .string({ error: 'room is required' })
      .trim()
      .min(1, 'room must be 1 to 60 characters')
      .max(60, 'room must be 1 to 60 characters'),
    /** A device's label until the device register links lists to devices. */
    deviceLabel: z
      .string()
      .trim()
      .max(60, 'deviceLabel must be at most 60 characters')
      .transform((v) => (v === '' ? null : v))
      .nullable()
      .optional(),
    startTime: z
      .string({ error: 'startTime is required' })
      .regex(clockTime, 'startTime must be a time of day HH:mm (00:00 to 23:59)'),
    sessionLengthMin: z
      .number({ error: 'sessionLengthMin must be a whole number of minutes' })
      .int('sessionLengthMin must be a whole number of minutes')
      .min(15, 'sessionLengthMin must be 15 to 720 minutes')
      .max(720, 'sessionLengthMin must be 15 to 720 minutes'),
    slotMin: z
      .number({ error: 'slotMin must be a whole number of minutes' })
      .int('slotMin must be a whole number of minutes')
      .min(5, 'slotMin must be 5 to 240 minutes')
      .max(240, 'slotMin must be 5 to 240 minutes'),
  })
  .refine((l) => l.slotMin <= l.sessionLengthMin, {
    path: ['slotMin'],
    message: 'slotMin must be at most sessionLengthMin',
  });
export type CreateListEntry = z.infer<typeof createListSchema>;

export const bookingSchema = z.strictObject({
  orderId: z
    .number({ error: 'orderId must be an order number' })
    .int('orderId must be an order number')
    .positive('orderId must be an order number'),
  slotIndex: z
    .number({ error: 'slotIndex must be a whole number from 0' })
    .int('slotIndex must be a whole number from 0')
    .min(0, 'slotIndex must be a whole number from 0')
    .max(287, 'slotIndex must be at most 287'),
});
export type BookingEntry = z.infer<typeof bookingSchema>;

export const listQuerySchema = z.strictObject({
  from: z.iso.date({ error: 'from must be a date (YYYY-MM-DD)' }),
  to: z.iso.date({ error: 'to must be a date (YYYY-MM-DD)' }),
});

export const listBookingSchema = z.object({
  id: z.number(),
  slotIndex: z.number(),
  startsAt: z.string(),
  endsAt: z.string(),
  order: z.object({
    id: z.number(),
    status: z.string(),
    eye: z.enum(eyes),
    kind: z.enum(['pdt', 'cxl']),
    protocolTitle: z.string(),
    beyondUseAt: z.string().nullable(),
    doseMg: z.number().nullable(),
  }),
  patient: z.object({
    id: z.number(),
    recordNumber: z.string(),
    givenName: z.string(),
    familyName: z.string(),
  }),
  /** When the drug must be ready (the slot's light time minus the protocol's light-start offset); null without a drug. */
  readyBy: z.string().nullable(),
  /** No earlier than this, or the drug is past its beyond-use time before the infusion ends. */
  earliestReconstitutionAt: z.string().nullable(),
});
export type ListBooking = z.infer<typeof listBookingSchema>;

export const treatmentListSchema = z.object({
  id: z.number(),
  listDate: z.string(),
  room: z.string(),
  deviceLabel: z.string().nullable(),
  startTime: z.string(),
  sessionLengthMin: z.number(),
  slotMin: z.number(),
  slots: z.array(z.object({ index: z.number(), startsAt: z.string(), endsAt: z.string() })),
  bookings: z.array(listBookingSchema),
});
export type TreatmentList = z.infer<typeof treatmentListSchema>;
