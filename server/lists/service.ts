import { DateTime } from 'luxon';
import { formatUnitTime } from '../../shared/format/figures';
import { bookableStatuses, bookingClash, listSlots } from '../../shared/lists/slots';
import type { BookingEntry, CreateListEntry, TreatmentList } from '../../shared/schemas/lists';
import { doseTimes } from '../../shared/stock/dose-times';
import { planVials, vialSharingCaution, type PlannedDose } from '../../shared/stock/vial-plan';
import type { AuditRepository } from '../audit/repository';
import type { Clock } from '../clock';
import type { ListBookingRow } from '../db/entities/list-booking';
import type { TreatmentListRow } from '../db/entities/treatment-list';
import { isDuplicateKey } from '../db/errors';
import type { UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import type { OrderRepository } from '../orders/repository';
import type { Actor } from '../orders/service';
import type { ListRepository } from './repository';

export function createListService(deps: {
  unitOfWork: UnitOfWork;
  lists: ListRepository;
  orders: Pick<OrderRepository, 'findById'>;
  audit: AuditRepository;
  clock: Clock;
  unitTimeZone: string;
  vialSharingAllowed: boolean;
}) {
  const { unitOfWork, lists, orders, audit, unitTimeZone: zone } = deps;
  const slotWords = (at: Date) => formatUnitTime(at.toISOString(), zone, 'short');

  function bookingView(b: ListBookingRow) {
    const o = b.order;
    const drug = o.protocolVersion.definition.drug;
    const times = drug
      ? doseTimes(b.startsAt, {
          lightStartAfterInfusionStartMin:
            o.protocolVersion.definition.timing?.lightStartAfterInfusionStartMin ?? 0,
          infusionMin: drug.infusionMin,
          beyondUseH: drug.beyondUseH,
        })
      : null;
    return {
      id: b.id,
      slotIndex: b.slotIndex,
      startsAt: b.startsAt.toISOString(),
      endsAt: b.endsAt.toISOString(),
      order: {
        id: o.id,
        status: o.status,
        eye: o.eye,
        kind: o.protocolVersion.kind,
        protocolTitle: o.protocolVersion.title,
        beyondUseAt: o.beyondUseAt?.toISOString() ?? null,
        doseMg: o.plan.doseMg ?? null,
      },
      patient: {
        id: o.patient.id,
        recordNumber: o.patient.recordNumber,
        givenName: o.patient.givenName,
        familyName: o.patient.familyName,
      },
      readyBy: times?.readyBy.toISOString() ?? null,
      earliestReconstitutionAt: times?.earliestReconstitutionAt.toISOString() ?? null,
    };
  }

  async function withBookings(rows: TreatmentListRow[]): Promise<TreatmentList[]> {
    const booked = await lists.bookingsOf(rows.map((l) => l.id));
    return rows.map((l) => ({
      id: l.id,
      listDate: l.listDate,
      room: l.room,
      deviceLabel: l.deviceLabel,
      startTime: l.startTime,
      sessionLengthMin: l.sessionLengthMin,
      slotMin: l.slotMin,
      slots: listSlots(l, zone).map((s) => ({
        index: s.index,
        startsAt: s.startsAt.toISOString(),
        endsAt: s.endsAt.toISOString(),
      })),
      bookings: booked.filter((b) => b.listId === l.id).map(bookingView),
    }));
  }

  async function loadList(id: number) {
    const list = await lists.findList(id);
    if (!list) throw AppError.notFound(`There is no treatment list ${id}.`);
    return list;
  }

  return {
    between: async (from: string, to: string) => ({
      lists: await withBookings(await lists.listsBetween(from, to)),
      vialSharingAllowed: deps.vialSharingAllowed,
    }),

    /** Today's lists in the unit's time zone (Today's worklists follow them). */
    today: async () => {
      const date = DateTime.fromJSDate(deps.clock.now()).setZone(zone).toISODate()!;
      return withBookings(await lists.listsBetween(date, date));
    },

    async get(id: number) {
      const [list] = await withBookings([await loadList(id)]);
      return list!;
    },

    async create(actor: Actor, entry: CreateListEntry) {
      const id = await unitOfWork((tx) =>
        lists.insertList(tx, {
          listDate: entry.listDate,
          room: entry.room,
          deviceLabel: entry.deviceLabel ?? null,
          startTime: entry.startTime,
          sessionLengthMin: entry.sessionLengthMin,
          slotMin: entry.slotMin,
          createdById: actor.id,
        }),
      ).catch((error: unknown) => {
        if (isDuplicateKey(error))
          throw AppError.conflict(
            'list_exists',
            `${entry.room} already has a list on ${entry.listDate} starting at ${entry.startTime}.`,
          );
        throw error;
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'list.created',
        entityType: 'treatment-list',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: { ...entry },
      });
      return this.get(id);
    },

    /**
     * Books a signed order into a slot. Refused: a slot out of range or taken, an order not
     * signed or already booked, the same patient at an overlapping time, the same eye twice on
     * one day — the refusal names the clashing slot.
     */
    async book(actor: Actor, listId: number, entry: BookingEntry) {
      const list = await loadList(listId);
      const slots = listSlots(list, zone);
      const slot = slots[entry.slotIndex];
      if (!slot)
        throw AppError.badRequest(`The list has ${slots.length} slots.`, [
          {
            path: 'slotIndex',
            message: `slotIndex must be 0 to ${slots.length - 1} (this list has ${slots.length} slots)`,
          },
        ]);
      const order = await orders.findById(entry.orderId);
      if (!order) throw AppError.notFound(`There is no order ${entry.orderId}.`);
      if (!bookableStatuses.includes(order.status))
        throw AppError.conflict(
          'order_not_bookable',
          `Order ${order.id} is ${order.status}: only a signed order not yet in a session can be booked.`,
        );
      const day = DateTime.fromISO(list.listDate);
      const nearDays = [-1, 0, 1].map((d) => day.plus({ days: d }).toISODate()!);
      const id = await unitOfWork(async (tx) => {
        await lists.lockPatient(tx, order.patientId);
        const theirs = await lists.patientBookings(tx, order.patientId, nearDays);
        const clash = bookingClash(
          {
            orderId: order.id,
            patientId: order.patientId,
            eye: order.eye,
            bookingDate: list.listDate,
            startsAt: slot.startsAt,
            endsAt: slot.endsAt,
          },
          theirs,
        );
        if (clash) {
          const other = clash.with;
          const where = `${other.room}, slot ${other.slotIndex + 1} at ${slotWords(other.startsAt)} on ${other.bookingDate} (order ${other.orderId})`;
          throw new AppError(
            409,
            clash.kind === 'patient-overlap' ? 'patient_double_booked' : 'eye_booked_same_day',
            clash.kind === 'patient-overlap'
              ? `This patient is already booked at an overlapping time: ${where}.`
              : `This patient's ${order.eye} eye is already booked that day: ${where}.`,
            [{ path: 'slotIndex', message: `clashes with ${where}` }],
          );
        }
        return lists.insertBooking(tx, {
          listId,
          slotIndex: slot.index,
          orderId: order.id,
          patientId: order.patientId,
          eye: order.eye,
          bookingDate: list.listDate,
          startsAt: slot.startsAt,
          endsAt: slot.endsAt,
          bookedById: actor.id,
        });
      }).catch(async (error: unknown) => {
        if (!isDuplicateKey(error)) throw error;
        const already = await lists.findBookingOfOrder(order.id);
        if (already)
          throw AppError.conflict(
            'order_already_booked',
            `Order ${order.id} is already booked (list ${already.listId}, slot ${already.slotIndex + 1}).`,
          );
        throw AppError.conflict(
          'slot_taken',
          `Slot ${slot.index + 1} at ${slotWords(slot.startsAt)} is taken; pick another.`,
        );
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'list.booked',
        entityType: 'order',
        entityId: order.id,
        ipAddress: actor.ipAddress,
        details: { listId, slotIndex: slot.index, bookingId: id },
      });
      return this.get(listId);
    },

    async unbook(actor: Actor, bookingId: number) {
      const booking = await lists.findBooking(bookingId);
      if (!booking) throw AppError.notFound(`There is no booking ${bookingId}.`);
      await unitOfWork((tx) => lists.deleteBooking(tx, bookingId));
      await audit.append({
        actorUserId: actor.id,
        action: 'list.unbooked',
        entityType: 'order',
        entityId: booking.orderId,
        ipAddress: actor.ipAddress,
        details: { listId: booking.listId, slotIndex: booking.slotIndex },
      });
      return this.get(booking.listId);
    },

    /** The vials the list's doses need and the order to prepare them in. */
    async vialPlan(listId: number) {
      const list = await this.get(listId);
      const booked = await lists.bookingsOf([listId]);
      const doses: PlannedDose[] = [];
      for (const b of booked) {
        const drug = b.order.protocolVersion.definition.drug;
        const plan = b.order.plan;
        if (!drug || plan.doseMg == null || plan.drugVolumeMl == null) continue;
        doses.push({
          orderId: b.orderId,
          label: `${b.order.patient.givenName} ${b.order.patient.familyName} (${b.order.patient.recordNumber}), ${b.order.eye} eye`,
          slotStartsAt: b.startsAt,
          doseMg: plan.doseMg,
          drugVolumeMl: plan.drugVolumeMl,
          timing: {
            lightStartAfterInfusionStartMin:
              b.order.protocolVersion.definition.timing?.lightStartAfterInfusionStartMin ?? 0,
            infusionMin: drug.infusionMin,
            beyondUseH: drug.beyondUseH,
          },
          vial: {
            vialContentMg: drug.vialContentMg,
            concentrationMgPerMl: drug.concentrationMgPerMl,
            withdrawableVolumeMlPerVial:
              drug.withdrawableVolumeMlPerVial ?? drug.reconstitutedVolumeMl,
            beyondUseH: drug.beyondUseH,
          },
        });
      }
      const plan = planVials(doses, deps.vialSharingAllowed);
      const iso = (d: Date) => d.toISOString();
      return {
        list: {
          id: list.id,
          listDate: list.listDate,
          room: list.room,
          deviceLabel: list.deviceLabel,
        },
        caution: vialSharingCaution,
        ...plan,
        steps: plan.steps.map((s) => ({ ...s, readyBy: iso(s.readyBy) })),
        vials: plan.vials.map((v) => ({
          ...v,
          reconstituteBy: iso(v.reconstituteBy),
          reconstituteNotBefore: iso(v.reconstituteNotBefore),
        })),
      };
    },
  };
}

export type ListService = ReturnType<typeof createListService>;
