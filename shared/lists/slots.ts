import { DateTime } from 'luxon';
import { cancellableStatuses } from '../orders/lifecycle';
import type { OrderStatus } from '../schemas/orders';

export interface ListShape {
  listDate: string;
  startTime: string;
  sessionLengthMin: number;
  slotMin: number;
}

export interface Slot {
  index: number;
  startsAt: Date;
  endsAt: Date;
}

/** The list's slots, in the unit's time zone: as many whole slots as fit in the session. */
export function listSlots(list: ListShape, timeZone: string): Slot[] {
  const start = DateTime.fromISO(`${list.listDate}T${list.startTime}`, { zone: timeZone });
  const count = Math.floor(list.sessionLengthMin / list.slotMin);
  return Array.from({ length: count }, (_, index) => {
    const startsAt = start.plus({ minutes: index * list.slotMin });
    return {
      index,
      startsAt: startsAt.toJSDate(),
      endsAt: startsAt.plus({ minutes: list.slotMin }).toJSDate(),
    };
  });
}

export interface BookedSlot {
  listId: number;
  room: string;
  slotIndex: number;
  orderId: number;
  patientId: number;
  eye: 'right' | 'left';
  /** The unit's calendar day of the slot. */
  bookingDate: string;
  startsAt: Date;
  endsAt: Date;
}

export type BookingClash =
  { kind: 'patient-overlap'; with: BookedSlot } | { kind: 'eye-same-day'; with: BookedSlot };

/**
 * Why a booking may not stand beside the patient's other bookings: the same patient at an
 * overlapping time (in any room), or the same eye twice on one day. Null when it may.
 */
export function bookingClash(
  candidate: Omit<BookedSlot, 'listId' | 'room' | 'slotIndex'>,
  existing: readonly BookedSlot[],
): BookingClash | null {
  const mine = existing.filter(
    (b) => b.patientId === candidate.patientId && b.orderId !== candidate.orderId,
  );
  const overlap = mine.find(
    (b) =>
      b.startsAt.getTime() < candidate.endsAt.getTime() &&
      candidate.startsAt.getTime() < b.endsAt.getTime(),
  );
  if (overlap) return { kind: 'patient-overlap', with: overlap };
  const sameEye = mine.find(
    (b) => b.eye === candidate.eye && b.bookingDate === candidate.bookingDate,
  );
  if (sameEye) return { kind: 'eye-same-day', with: sameEye };
  return null;
}

/** Orders that may be booked into a slot: signed and not yet in a session, nor sent back. */
export const bookableStatuses: readonly OrderStatus[] = cancellableStatuses.filter(
  (s) => s !== 'draft' && s !== 'returned',
);
