import type { DataSource } from 'typeorm';
import { PreparationStockRow } from '../db/entities/preparation-stock';
import { StockLotRow } from '../db/entities/stock-lot';
import { StockMovementRow } from '../db/entities/stock-movement';
import { managerOf, type Transaction } from '../db/unit-of-work';

/** Every preparation made with a lot (by its text), through the index on preparation.vial_lot. */
export const recallSql = `SELECT o.id AS orderId, pt.id AS patientId, pt.record_number AS recordNumber,
                pt.given_name AS givenName, pt.family_name AS familyName, o.eye, o.status,
                p.reconstituted_at AS reconstitutedAt, p.volume_drawn_ml AS volumeDrawnMl,
                JSON_VALUE(o.plan, '$.doseMg') AS doseMg,
                u.display_name AS clinicianName, u.email AS clinicianEmail, u.active AS clinicianActive
           FROM preparation p
           JOIN treatment_order o ON o.id = p.order_id
           JOIN patient pt ON pt.id = o.patient_id
           LEFT JOIN user u ON u.id = o.signed_by
          WHERE p.vial_lot = ?
          ORDER BY p.reconstituted_at, p.id`;

export interface RecallDbRow {
  orderId: number;
  patientId: number;
  recordNumber: string;
  givenName: string;
  familyName: string;
  eye: string;
  status: string;
  reconstitutedAt: Date;
  volumeDrawnMl: number;
  doseMg: number | null;
  clinicianName: string | null;
  clinicianEmail: string | null;
  clinicianActive: boolean | null;
}

export function createStockRepository(dataSource: DataSource) {
  const lots = dataSource.getRepository(StockLotRow);
  const lotsOf = (tx?: Transaction) => managerOf(tx)?.getRepository(StockLotRow) ?? lots;
  return {
    findLot: (id: number, tx?: Transaction) => lotsOf(tx).findOne({ where: { id } }),
    findLotByProduct: (product: string, lot: string, tx?: Transaction) =>
      lotsOf(tx).findOne({ where: { product, lot } }),
    lockLot: (tx: Transaction, id: number) =>
      lotsOf(tx).findOne({ where: { id }, lock: { mode: 'pessimistic_write' } }),
    lockLotByProduct: (tx: Transaction, product: string, lot: string) =>
      lotsOf(tx).findOne({ where: { product, lot }, lock: { mode: 'pessimistic_write' } }),
    listLots: () => lots.find({ order: { product: 'ASC', expiry: 'ASC', id: 'ASC' } }),

    insertLot: async (
      tx: Transaction,
      lot: Pick<StockLotRow, 'product' | 'lot' | 'expiry' | 'quantityOnHand' | 'receivedQuantity'>,
    ) => (await lotsOf(tx).insert(lot)).identifiers[0]!.id as number,

    /** Adds received units to a lot already held. */
    addToLot: (tx: Transaction, id: number, quantity: number) =>
      managerOf(tx).query(
        'UPDATE stock_lot SET quantity_on_hand = quantity_on_hand + ?, received_quantity = received_quantity + ? WHERE id = ?',
        [quantity, quantity, id],
      ),

    setQuantity: (tx: Transaction, id: number, quantity: number) =>
      managerOf(tx).query('UPDATE stock_lot SET quantity_on_hand = ? WHERE id = ?', [quantity, id]),

    /**
     * Takes `quantity` units from a lot in one conditional statement: only while it holds that
     * many and has not expired on `today`. Returns whether it did; the row stays locked to the end
     * of the transaction, so two preparations can never both take the last vial.
     */
    async takeFromLot(tx: Transaction, id: number, quantity: number, today: string) {
      const result = await managerOf(tx).query(
        'UPDATE stock_lot SET quantity_on_hand = quantity_on_hand - ? WHERE id = ? AND quantity_on_hand >= ? AND expiry >= ?',
        [quantity, id, quantity, today],
      );
      return Number((result as { affectedRows?: number }).affectedRows ?? 0) === 1;
    },

    /** The in-date lot of a product that expires first and holds enough, locked (first-expiry-first). */
    firstExpiringLot: (tx: Transaction, product: string, quantity: number, today: string) =>
      lotsOf(tx)
        .createQueryBuilder('l')
        .where('l.product = :product AND l.expiry >= :today AND l.quantity_on_hand >= :quantity', {
          product,
          today,
          quantity,
        })
        .orderBy('l.expiry', 'ASC')
        .addOrderBy('l.id', 'ASC')
        .setLock('pessimistic_write')
        .getOne(),

    /** Every lot of a product, to say why none could be issued. */
    lotsOfProduct: (product: string, tx?: Transaction) =>
      lotsOf(tx).find({ where: { product }, order: { expiry: 'ASC' } }),

    addMovement: (
      tx: Transaction,
      movement: Omit<StockMovementRow, 'id' | 'occurredAt' | 'stockLot'>,
    ) => managerOf(tx).getRepository(StockMovementRow).insert(movement),

    addPreparationStock: (
      tx: Transaction,
      row: Omit<PreparationStockRow, 'createdAt' | 'preparation' | 'stockLot'>,
    ) => managerOf(tx).getRepository(PreparationStockRow).insert(row),

    movementsOf: (lotId: number) =>
      dataSource
        .getRepository(StockMovementRow)
        .find({ where: { lotId }, order: { id: 'DESC' }, take: 200 }),

    /**
     * Every preparation made with a lot, by the lot's text (a lot issued from stock and one typed
     * by hand alike), through the index on preparation.vial_lot.
     */
    async recall(lot: string): Promise<RecallDbRow[]> {
      const rows: Record<string, unknown>[] = await dataSource.query(recallSql, [lot]);
      return rows.map((r) => ({
        orderId: Number(r.orderId),
        patientId: Number(r.patientId),
        recordNumber: String(r.recordNumber),
        givenName: String(r.givenName),
        familyName: String(r.familyName),
        eye: String(r.eye),
        status: String(r.status),
        reconstitutedAt: r.reconstitutedAt as Date,
        volumeDrawnMl: Number(r.volumeDrawnMl),
        doseMg: r.doseMg === null ? null : Number(r.doseMg),
        clinicianName: (r.clinicianName as string | null) ?? null,
        clinicianEmail: (r.clinicianEmail as string | null) ?? null,
        clinicianActive: r.clinicianActive === null ? null : Boolean(Number(r.clinicianActive)),
      }));
    },

    /** Each preparation with its stock record since `from`: what the monthly report counts. */
    async usageSince(from: Date) {
      const rows: Record<string, unknown>[] = await dataSource.query(
        `SELECT p.reconstituted_at AS reconstitutedAt, o.status,
                p.id = (SELECT MAX(l.id) FROM preparation l WHERE l.order_id = p.order_id) AS isLatest,
                ps.vials_opened AS vialsOpened, ps.dose_mg AS doseMg, ps.discarded_mg AS discardedMg
           FROM preparation_stock ps
           JOIN preparation p ON p.id = ps.preparation_id
           JOIN treatment_order o ON o.id = p.order_id
          WHERE ps.created_at >= ?`,
        [from],
      );
      return rows.map((r) => ({
        reconstitutedAt: r.reconstitutedAt as Date,
        orderStatus: String(r.status),
        isLatest: Number(r.isLatest) === 1,
        vialsOpened: Number(r.vialsOpened),
        doseMg: Number(r.doseMg),
        discardedMg: Number(r.discardedMg),
      }));
    },
  };
}

export type StockRepository = ReturnType<typeof createStockRepository>;
