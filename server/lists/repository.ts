import { Between, In, type DataSource } from 'typeorm';
import { ListBookingRow } from '../db/entities/list-booking';
import { TreatmentListRow } from '../db/entities/treatment-list';
import { managerOf, type Transaction } from '../db/unit-of-work';

export function createListRepository(dataSource: DataSource) {
  const lists = dataSource.getRepository(TreatmentListRow);
  const bookings = dataSource.getRepository(ListBookingRow);
  return {
    findList: (id: number) => lists.findOne({ where: { id } }),
    listsBetween: (from: string, to: string) =>
      lists.find({
        where: { listDate: Between(from, to) },
        order: { listDate: 'ASC', startTime: 'ASC', room: 'ASC' },
      }),
    insertList: async (tx: Transaction, row: Omit<TreatmentListRow, 'id' | 'createdAt'>) =>
      (await managerOf(tx).getRepository(TreatmentListRow).insert(row)).identifiers[0]!
        .id as number,

    bookingsOf: (listIds: number[]) =>
      listIds.length === 0
        ? Promise.resolve([])
        : bookings.find({
            where: { listId: In(listIds) },
            relations: { order: { patient: true, protocolVersion: true } },
            order: { slotIndex: 'ASC' },
          }),
    findBooking: (id: number) => bookings.findOne({ where: { id } }),
    findBookingOfOrder: (orderId: number) => bookings.findOne({ where: { orderId } }),

    /**
     * Holds the patient's row for the rest of the transaction, so two bookings of one patient
     * are judged one after the other and cannot both pass the clash check.
     */
    lockPatient: (tx: Transaction, patientId: number) =>
      managerOf(tx).query('SELECT id FROM patient WHERE id = ? FOR UPDATE', [patientId]),

    /** The patient's bookings on these days, with the room of each. */
    async patientBookings(tx: Transaction, patientId: number, dates: string[]) {
      const rows: Record<string, unknown>[] = await managerOf(tx).query(
        `SELECT b.list_id AS listId, l.room, b.slot_index AS slotIndex, b.order_id AS orderId,
                b.patient_id AS patientId, b.eye, b.booking_date AS bookingDate,
                b.starts_at AS startsAt, b.ends_at AS endsAt
           FROM list_booking b JOIN treatment_list l ON l.id = b.list_id
          WHERE b.patient_id = ? AND b.booking_date IN (?)`,
        [patientId, dates],
      );
      return rows.map((r) => ({
        listId: Number(r.listId),
        room: String(r.room),
        slotIndex: Number(r.slotIndex),
        orderId: Number(r.orderId),
        patientId: Number(r.patientId),
        eye: r.eye as 'right' | 'left',
        bookingDate: String(r.bookingDate),
        startsAt: r.startsAt as Date,
        endsAt: r.endsAt as Date,
      }));
    },

    insertBooking: async (
      tx: Transaction,
      row: Omit<ListBookingRow, 'id' | 'createdAt' | 'list' | 'order'>,
    ) =>
      (await managerOf(tx).getRepository(ListBookingRow).insert(row)).identifiers[0]!.id as number,
    deleteBooking: (tx: Transaction, id: number) =>
      managerOf(tx).getRepository(ListBookingRow).delete({ id }),
  };
}

export type ListRepository = ReturnType<typeof createListRepository>;
