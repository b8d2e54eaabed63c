import { DateTime } from 'luxon';
import { formatUnitTime } from '../../shared/format/figures';
import {
  stockUnitOf,
  type AdjustStockEntry,
  type ReceiveStockEntry,
  type RecallRow,
  type StockLot,
  type StockProduct,
} from '../../shared/schemas/stock';
import { monthUse, preparationUse } from '../../shared/stock/drug-use';
import type { AuditRepository } from '../audit/repository';
import type { Clock } from '../clock';
import type { StockLotRow } from '../db/entities/stock-lot';
import { isDuplicateKey } from '../db/errors';
import type { Transaction, UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import { enqueueMessage } from '../mail/outbox-repository';
import type { Actor } from '../orders/service';
import { csvLine } from '../review/csv';
import type { StockRepository } from './repository';

/** Lots expiring within this many days are listed apart, to be used first or returned. */
export const expiringWithinDays = 30;

export function createStockService(deps: {
  unitOfWork: UnitOfWork;
  stock: StockRepository;
  audit: AuditRepository;
  clock: Clock;
  unitTimeZone: string;
}) {
  const { unitOfWork, stock, audit, clock, unitTimeZone } = deps;
  const today = () => DateTime.fromJSDate(clock.now()).setZone(unitTimeZone).toISODate()!;

  function toLot(row: StockLotRow): StockLot {
    const now = today();
    const soon = DateTime.fromISO(now).plus({ days: expiringWithinDays }).toISODate()!;
    return {
      id: row.id,
      product: row.product,
      unit: stockUnitOf[row.product as StockProduct] ?? 'unit',
      lot: row.lot,
      expiry: row.expiry,
      quantityOnHand: row.quantityOnHand,
      receivedQuantity: row.receivedQuantity,
      expired: row.expiry < now,
      expiresWithin30Days: row.expiry >= now && row.expiry <= soon,
    };
  }

  async function recallRows(lot: string): Promise<RecallRow[]> {
    return (await stock.recall(lot)).map((r) => ({
      orderId: r.orderId,
      patient: {
        id: r.patientId,
        recordNumber: r.recordNumber,
        name: `${r.givenName} ${r.familyName}`,
      },
      eye: r.eye,
      date: DateTime.fromJSDate(r.reconstitutedAt).setZone(unitTimeZone).toISODate()!,
      doseMg: r.doseMg,
      volumeDrawnMl: r.volumeDrawnMl,
      status: r.status,
      clinician: r.clinicianName,
    }));
  }

  return {
    async lots() {
      return { lots: (await stock.listLots()).map(toLot), today: today() };
    },

    async movements(lotId: number) {
      const lot = await stock.findLot(lotId);
      if (!lot) throw AppError.notFound(`There is no stock lot ${lotId}.`);
      return { lot: toLot(lot), movements: await stock.movementsOf(lotId) };
    },

    /** Receives units of a lot: a new lot, or more of one held (its expiry must agree). */
    async receive(actor: Actor, entry: ReceiveStockEntry) {
      if (entry.expiry < today())
        throw AppError.badRequest(
          `Lot ${entry.lot} expired on ${entry.expiry}; do not receive it.`,
          [{ path: 'expiry', message: `expiry must be today (${today()}) or later` }],
        );
      const lotId = await unitOfWork(async (tx) => {
        const held = await stock.lockLotByProduct(tx, entry.product, entry.lot);
        if (held) {
          if (held.expiry !== entry.expiry)
            throw AppError.badRequest(
              `Lot ${entry.lot} of ${entry.product} is held with expiry ${held.expiry}, not ${entry.expiry}.`,
              [{ path: 'expiry', message: `expiry must be ${held.expiry}, as the lot held` }],
            );
          await stock.addToLot(tx, held.id, entry.quantity);
          await stock.addMovement(tx, {
            lotId: held.id,
            kind: 'received',
            quantityChange: entry.quantity,
            quantityAfter: held.quantityOnHand + entry.quantity,
            reason: null,
            orderId: null,
            actorId: actor.id,
          });
          return held.id;
        }
        const id = await stock.insertLot(tx, {
          product: entry.product,
          lot: entry.lot,
          expiry: entry.expiry,
          quantityOnHand: entry.quantity,
          receivedQuantity: entry.quantity,
        });
        await stock.addMovement(tx, {
          lotId: id,
          kind: 'received',
          quantityChange: entry.quantity,
          quantityAfter: entry.quantity,
          reason: null,
          orderId: null,
          actorId: actor.id,
        });
        return id;
      }).catch((error: unknown) => {
        if (isDuplicateKey(error))
          throw AppError.conflict(
            'lot_received_twice',
            `Lot ${entry.lot} was received by someone else at the same moment; reload and try again.`,
          );
        throw error;
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'stock.received',
        entityType: 'stock-lot',
        entityId: lotId,
        ipAddress: actor.ipAddress,
        details: { ...entry },
      });
      return toLot((await stock.findLot(lotId))!);
    },

    /** A count that differs from the book: the quantity becomes the count; who and why are kept. */
    async adjust(actor: Actor, lotId: number, entry: AdjustStockEntry) {
      const before = await unitOfWork(async (tx) => {
        const lot = await stock.lockLot(tx, lotId);
        if (!lot) throw AppError.notFound(`There is no stock lot ${lotId}.`);
        if (lot.quantityOnHand === entry.countedQuantity)
          throw AppError.badRequest(`Lot ${lot.lot} already holds ${lot.quantityOnHand}.`, [
            {
              path: 'countedQuantity',
              message: `countedQuantity must differ from the ${lot.quantityOnHand} on hand`,
            },
          ]);
        await stock.setQuantity(tx, lotId, entry.countedQuantity);
        await stock.addMovement(tx, {
          lotId,
          kind: 'adjusted',
          quantityChange: entry.countedQuantity - lot.quantityOnHand,
          quantityAfter: entry.countedQuantity,
          reason: entry.reason,
          orderId: null,
          actorId: actor.id,
        });
        return lot.quantityOnHand;
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'stock.adjusted',
        entityType: 'stock-lot',
        entityId: lotId,
        ipAddress: actor.ipAddress,
        details: { before, after: entry.countedQuantity, reason: entry.reason },
      });
      return toLot((await stock.findLot(lotId))!);
    },

    /**
     * Takes the vials for one preparation, inside the preparation's transaction: from the lot
     * named, or the in-date lot that expires first. Expired or too few on hand: refused, and the
     * transaction (with its preparation) is rolled back.
     */
    async issue(
      tx: Transaction,
      input: {
        product: string;
        lotId: number | null;
        vials: number;
        actorId: number;
        orderId: number;
      },
    ): Promise<StockLotRow | null> {
      const now = today();
      if (input.vials === 0) {
        // A dose drawn from a shared vial already issued: nothing leaves the shelf.
        return input.lotId === null ? null : ((await stock.findLot(input.lotId, tx)) ?? null);
      }
      let lot: StockLotRow | null;
      if (input.lotId !== null) {
        lot = await stock.findLot(input.lotId, tx);
        if (!lot || lot.product !== input.product)
          throw AppError.badRequest(`There is no ${input.product} stock lot ${input.lotId}.`, [
            { path: 'stockLotId', message: `stockLotId must be a lot of ${input.product}` },
          ]);
        if (!(await stock.takeFromLot(tx, lot.id, input.vials, now))) {
          const current = (await stock.findLot(lot.id, tx))!;
          if (current.expiry < now)
            throw AppError.conflict(
              'stock_expired',
              `Lot ${current.lot} of ${current.product} expired on ${current.expiry}: it cannot be issued.`,
            );
          throw AppError.conflict(
            'stock_empty',
            `Lot ${current.lot} of ${current.product} has ${current.quantityOnHand} on hand; this preparation needs ${input.vials}.`,
          );
        }
      } else {
        lot = await stock.firstExpiringLot(tx, input.product, input.vials, now);
        if (!lot || !(await stock.takeFromLot(tx, lot.id, input.vials, now))) {
          const held = await stock.lotsOfProduct(input.product, tx);
          const expired = held.filter((l) => l.expiry < now && l.quantityOnHand > 0);
          throw AppError.conflict(
            'no_stock',
            `No in-date lot of ${input.product} holds ${input.vials} ${input.vials === 1 ? 'vial' : 'vials'}` +
              (expired.length
                ? ` (expired: ${expired.map((l) => `${l.lot}, ${l.expiry}`).join('; ')})`
                : '') +
              '. Receive stock before preparing.',
          );
        }
      }
      await stock.addMovement(tx, {
        lotId: lot.id,
        kind: 'issued',
        quantityChange: -input.vials,
        quantityAfter: lot.quantityOnHand - input.vials,
        reason: null,
        orderId: input.orderId,
        actorId: input.actorId,
      });
      return lot;
    },

    recordPreparationStock: stock.addPreparationStock,
    findLotByProduct: stock.findLotByProduct,

    async recall(actor: Actor, lot: string) {
      const rows = await recallRows(lot);
      await audit.append({
        actorUserId: actor.id,
        action: 'stock.recall-searched',
        entityType: 'stock-lot',
        entityId: lot,
        ipAddress: actor.ipAddress,
        details: { lot, found: rows.length },
      });
      return { lot, rows };
    },

    async *recallCsv(actor: Actor, lot: string): AsyncGenerator<string> {
      const rows = await recallRows(lot);
      await audit.append({
        actorUserId: actor.id,
        action: 'stock.recall-exported',
        entityType: 'stock-lot',
        entityId: lot,
        ipAddress: actor.ipAddress,
        details: { lot, rows: rows.length },
      });
      yield csvLine([
        'lot',
        'order',
        'record number',
        'patient',
        'eye',
        'date',
        'dose mg',
        'volume drawn mL',
        'status',
        'clinician',
      ]);
      for (const r of rows)
        yield csvLine([
          lot,
          r.orderId,
          r.patient.recordNumber,
          r.patient.name,
          r.eye,
          r.date,
          r.doseMg,
          r.volumeDrawnMl,
          r.status,
          r.clinician,
        ]);
    },

    /** One e-mail per clinician who signed an order that used the lot, through the outbox. */
    async notifyRecall(actor: Actor, lot: string) {
      const rows = await stock.recall(lot);
      if (rows.length === 0)
        throw AppError.conflict(
          'recall_nothing_found',
          `No preparation used lot ${lot}; there is no one to tell.`,
        );
      const byClinician = new Map<string, typeof rows>();
      for (const r of rows) {
        if (!r.clinicianEmail || r.clinicianActive === false) continue;
        byClinician.set(r.clinicianEmail, [...(byClinician.get(r.clinicianEmail) ?? []), r]);
      }
      await unitOfWork(async (tx) => {
        for (const [email, theirs] of byClinician) {
          await enqueueMessage(tx, {
            kind: 'lot-recall',
            recipients: [email],
            subject: `Luxtempo: lot ${lot} is recalled — ${theirs.length} of your patients received it`,
            body: [
              `Lot ${lot} has been recalled. Your patients who received drug from it:`,
              '',
              ...theirs.map(
                (r) =>
                  `- ${r.givenName} ${r.familyName} (${r.recordNumber}), ${r.eye} eye, ${formatUnitTime(r.reconstitutedAt.toISOString(), unitTimeZone, 'date')}, ${r.doseMg ?? '—'} mg (order ${r.orderId})`,
              ),
              '',
              'Open Luxtempo for the full list; follow the unit’s recall procedure and local policy.',
            ].join('\n'),
            related: { type: 'recall', id: lot },
          });
        }
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'stock.recall-notified',
        entityType: 'stock-lot',
        entityId: lot,
        ipAddress: actor.ipAddress,
        details: { lot, clinicians: [...byClinician.keys()], patients: rows.length },
      });
      return { lot, messages: byClinician.size, patients: rows.length };
    },

    /** The last twelve months: vials issued, drug given and discarded, doses never infused. */
    async monthlyReport() {
      const start = DateTime.fromJSDate(clock.now())
        .setZone(unitTimeZone)
        .startOf('month')
        .minus({ months: 11 });
      const rows = await stock.usageSince(start.toJSDate());
      const months = Array.from({ length: 12 }, (_, i) =>
        start.plus({ months: i }).toFormat('yyyy-MM'),
      );
      // Each preparation's month worked out once, in the unit's zone.
      const byMonth = new Map<string, Parameters<typeof monthUse>[1][number][]>(
        months.map((m) => [m, []]),
      );
      for (const r of rows) {
        const month = DateTime.fromJSDate(r.reconstitutedAt)
          .setZone(unitTimeZone)
          .toFormat('yyyy-MM');
        byMonth.get(month)?.push({
          use: preparationUse({ isLatest: r.isLatest, orderStatus: r.orderStatus }),
          doseMg: r.doseMg,
          discardedMg: r.discardedMg,
          vialsIssued: r.vialsOpened,
        });
      }
      return { months: months.map((month) => monthUse(month, byMonth.get(month)!)) };
    },
  };
}

export type StockService = ReturnType<typeof createStockService>;
