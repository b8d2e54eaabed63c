import { fieldLabel, fieldWord } from '../../shared/format/field-labels';
import { DateTime } from 'luxon';
import { doseCheckDiffering } from '../../shared/engine/dose-check';
import { withinPct } from '../../shared/engine/tolerance';
import { canReprepare } from '../../shared/orders/lifecycle';
import { withdrawalsApplied } from '../../shared/session/dose-record';
import type { DoseCheckEntry, PreparationEntry } from '../../shared/schemas/orders';
import type { AuditRepository } from '../audit/repository';
import type { Clock } from '../clock';
import type { UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import { enqueueMessage } from '../mail/outbox-repository';
import { moveOrderStatus, type OrderRepository } from '../orders/repository';
import type { Actor, OrderService } from '../orders/service';
import type { UserRepository } from '../people/repository';
import { addParticipant, readSessionEvents } from '../sessions/repository';
import type { StockService } from '../stock/service';

/** A second refused check sends the order back to the clinician. */
export const refusalsBeforeReturn = 2;
/** Clocks on a ward disagree a little; a reconstitution time this far ahead of ours is still "now". */
const clockSkewS = 60;

export function createPharmacyService(deps: {
  unitOfWork: UnitOfWork;
  orders: OrderRepository;
  orderService: OrderService;
  users: UserRepository;
  audit: AuditRepository;
  unitTimeZone: string;
  /** The server's clock (tests move it); expiry and beyond-use times are judged by it. */
  clock: Clock;
  /** The pharmacy's stock: a preparation issues its vials from a lot in the same transaction. */
  stock: StockService;
  /** The unit's policy: may one vial serve more than one patient (config VIAL_SHARING_ALLOWED)? */
  vialSharingAllowed: boolean;
}) {
  const { unitOfWork, clock, orders, orderService, users, audit } = deps;

  async function loadForPharmacy(id: number) {
    const order = await orders.findById(id);
    if (!order) throw AppError.notFound(`There is no order ${id}.`);
    const drug = order.protocolVersion.definition.drug;
    if (!drug)
      throw AppError.conflict(
        'no_drug',
        `Order ${id} uses ${order.protocolVersion.key}, which has no drug to check or prepare.`,
      );
    return { order, drug };
  }

  /**
   * Where the vials come from: a stock lot named by id or by its text, the lot that expires
   * first when none is named, or — for a typed lot the pharmacy does not hold — outside stock
   * (null; then its expiry must be typed too).
   */
  async function stockSource(
    product: string,
    entry: PreparationEntry,
  ): Promise<{ lotId: number | null } | null> {
    if (entry.stockLotId !== undefined) return { lotId: entry.stockLotId };
    if (entry.vialLot === undefined) return { lotId: null };
    const held = await deps.stock.findLotByProduct(product, entry.vialLot);
    if (held) {
      if (entry.vialExpiry !== undefined && entry.vialExpiry !== held.expiry)
        throw AppError.badRequest(`Lot ${held.lot} is held in stock with expiry ${held.expiry}.`, [
          { path: 'vialExpiry', message: `vialExpiry must be ${held.expiry}, as the lot in stock` },
        ]);
      return { lotId: held.id };
    }
    if (entry.vialExpiry === undefined)
      throw AppError.badRequest(`Lot ${entry.vialLot} is not in stock: type its expiry too.`, [
        { path: 'vialExpiry', message: 'vialExpiry is required for a lot not held in stock' },
      ]);
    return null;
  }

  /** Vials opened and drug discarded: the plan's vials unless a shared vial (policy permitting) serves. */
  function issueFigures(
    plan: { vials: number | null; doseMg: number | null },
    drug: { vialContentMg: number },
    entry: PreparationEntry,
  ) {
    const planned = plan.vials ?? 1;
    const vialsOpened = entry.vialsOpened ?? planned;
    const fewest = deps.vialSharingAllowed ? 0 : planned;
    if (vialsOpened < fewest || vialsOpened > planned)
      throw AppError.badRequest(
        deps.vialSharingAllowed
          ? `This dose needs at most ${planned} new vials.`
          : `The unit does not allow vial sharing: this dose opens the plan's ${planned} ${planned === 1 ? 'vial' : 'vials'}.`,
        [
          {
            path: 'vialsOpened',
            message:
              fewest === planned
                ? `vialsOpened must be ${planned}`
                : `vialsOpened must be ${fewest} to ${planned}`,
          },
        ],
      );
    const heldMg = Math.max(vialsOpened, 1) * drug.vialContentMg;
    const remainderMg = Math.max(
      0,
      Number((vialsOpened * drug.vialContentMg - (plan.doseMg ?? 0)).toFixed(2)),
    );
    const discardedMg = entry.discardedMg ?? remainderMg;
    if (discardedMg > heldMg)
      throw AppError.badRequest(`More drug discarded than the opened vials held.`, [
        { path: 'discardedMg', message: `discardedMg must be 0 to ${heldMg} mg` },
      ]);
    if (entry.discardedMg !== undefined && discardedMg > 0 && !entry.discardReason)
      throw AppError.badRequest('Say why the drug was discarded.', [
        { path: 'discardReason', message: 'discardReason is required when discardedMg is above 0' },
      ]);
    const discardReason =
      discardedMg > 0
        ? (entry.discardReason ??
          'What the opened vials held beyond the dose (not kept for another patient)')
        : null;
    return { vialsOpened, discardedMg, discardReason };
  }

  return {
    /**
     * Compares the pharmacist's own figures with the frozen plan. A match reveals the plan; a
     * mismatch says which figures differ but not by how much, so the next try stays independent.
     */
    async check(actor: Actor, id: number, entry: DoseCheckEntry) {
      const { order } = await loadForPharmacy(id);
      if (order.signedById === actor.id || order.createdById === actor.id) {
        const act = order.signedById === actor.id ? 'signed' : 'drafted';
        throw AppError.forbidden(
          `You ${act} this order, so you cannot check it: the dose check must be done by someone else.`,
        );
      }
      const tolerance = order.protocolVersion.definition.tolerances.doseCheck;
      if (!tolerance)
        throw AppError.conflict(
          'no_dose_check',
          `Protocol ${order.protocolVersion.key} sets no dose-check tolerance.`,
        );
      // Within tolerance of the plan's rounded figure or of the unrounded working: exact figures pass.
      const differing: string[] = doseCheckDiffering(order.plan, entry, tolerance);
      const outcome = differing.length === 0 ? 'match' : 'mismatch';

      // Read before the transaction, which must not wait for a second pooled connection.
      const clinician = order.signedById ? await users.findById(order.signedById) : null;
      const result = await unitOfWork(async (tx) => {
        const locked = await orders.lockById(tx, id);
        if (locked?.status !== 'signed')
          throw AppError.conflict(
            'not_waiting_for_check',
            `Order ${id} is ${locked?.status ?? 'gone'}, not waiting for a dose check.`,
          );
        await orders.addDoseCheck(tx, {
          orderId: id,
          pharmacistId: actor.id,
          bsaM2: entry.bsaM2,
          doseMg: entry.doseMg,
          drugVolumeMl: entry.drugVolumeMl,
          outcome,
          differing,
          comment: entry.comment ?? null,
        });
        if (outcome === 'match') {
          await moveOrderStatus(tx, id, 'signed', 'checked');
          await addParticipant(tx, id, actor.id, 'checked');
          return { returned: false, refusals: 0 };
        }
        const refusals = (await orders.doseChecksFor(id, tx)).filter(
          (c) => c.outcome === 'mismatch',
        ).length;
        if (refusals < refusalsBeforeReturn) return { returned: false, refusals };
        const comment =
          entry.comment?.trim() ||
          `The dose check was refused ${refusals} times (figures differing: ${differing.map(fieldWord).join(', ')}).`;
        await moveOrderStatus(tx, id, 'signed', 'returned', { returnComment: comment });
        await enqueueMessage(tx, {
          kind: 'order-returned',
          recipients: clinician?.active ? [clinician.email] : [],
          subject: `Luxtempo: order ${id} was sent back after the dose check`,
          body: [
            `The independent dose check for order ${id} (${order.protocolVersion.title}, ${order.eye} eye) was refused ${refusals} times.`,
            '',
            `Pharmacist's comment: ${comment}`,
            '',
            'Open Luxtempo to review and amend the order.',
          ].join('\n'),
          related: { type: 'order', id },
        });
        return { returned: true, refusals };
      });

      await audit.append({
        actorUserId: actor.id,
        action:
          outcome === 'match'
            ? 'dose-check.matched'
            : result.returned
              ? 'dose-check.refused-and-returned'
              : 'dose-check.refused',
        entityType: 'order',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: {
          entered: { bsaM2: entry.bsaM2, doseMg: entry.doseMg, drugVolumeMl: entry.drugVolumeMl },
          differing,
          comment: entry.comment ?? null,
        },
      });
      if (outcome === 'mismatch') {
        const message = result.returned
          ? `Your figures differ from the plan again (${differing.map(fieldWord).join(', ')}): the order goes back to the clinician with your comment.`
          : `Your figures differ from the plan: ${differing.map(fieldWord).join(', ')}. Recalculate and enter them again; one more refusal sends the order back to the clinician.`;
        throw new AppError(
          422,
          result.returned ? 'dose_check_returned' : 'dose_check_mismatch',
          message,
          differing.map((path) => ({
            path,
            message: `${fieldLabel(path)} is outside the protocol's tolerance`,
          })),
        );
      }
      return orderService.detail(id, actor);
    },

    async prepare(actor: Actor, id: number, entry: PreparationEntry) {
      const { order, drug } = await loadForPharmacy(id);
      const zone = deps.unitTimeZone;
      const today = DateTime.fromJSDate(clock.now()).setZone(zone).toISODate()!;
      const fromStock = await stockSource(drug.name, entry);
      if (fromStock === null && entry.vialExpiry && entry.vialExpiry < today) {
        throw AppError.badRequest(`The vial expired on ${entry.vialExpiry}; use an in-date vial.`, [
          { path: 'vialExpiry', message: `vialExpiry must be today (${today}) or later` },
        ]);
      }
      const now = clock.now().getTime();
      const reconstitutedAt = entry.reconstitutedAt
        ? new Date(entry.reconstitutedAt)
        : new Date(now);
      if (reconstitutedAt.getTime() > now + clockSkewS * 1000) {
        throw AppError.badRequest('The reconstitution time is in the future.', [
          { path: 'reconstitutedAt', message: 'reconstitutedAt cannot be in the future' },
        ]);
      }
      const beyondUseAt = new Date(reconstitutedAt.getTime() + drug.beyondUseH * 3_600_000);
      if (beyondUseAt.getTime() <= now) {
        throw AppError.badRequest(
          `Drug reconstituted then is already past its beyond-use time of ${drug.beyondUseH} h.`,
          [
            {
              path: 'reconstitutedAt',
              message: `reconstitutedAt must be within the last ${drug.beyondUseH} hours`,
            },
          ],
        );
      }
      const planned = order.plan.drugVolumeMl;
      const pct = order.protocolVersion.definition.tolerances.drugVolumePct;
      if (planned != null && pct != null && !withinPct(entry.volumeDrawnMl, planned, pct)) {
        const low = +(planned * (1 - pct / 100)).toFixed(2);
        const high = +(planned * (1 + pct / 100)).toFixed(2);
        throw AppError.badRequest(`The volume drawn differs from the plan by more than ${pct}%.`, [
          {
            path: 'volumeDrawnMl',
            message: `volumeDrawnMl must be between ${low} and ${high} mL (plan ${planned} mL ± ${pct}%)`,
          },
        ]);
      }
      const stockFigures = issueFigures(order.plan, drug, entry);
      const infusionStepId =
        order.protocolVersion.definition.steps.find((step) => step.kind === 'infusion')?.id ?? null;
      let issued = { stockLotId: null as number | null, vialLot: '', vialExpiry: '' };
      const discarded = await unitOfWork(async (tx) => {
        const locked = await orders.lockById(tx, id);
        let previous: { beyondUseAt: string } | null = null;
        if (locked && locked.status !== 'checked') {
          // Made up again: the drug made up before is past its beyond-use time and was discarded
          // (shared/orders/lifecycle.ts canReprepare). The status stays; the new preparation counts.
          const current = await orders.preparationFor(id, tx);
          const { kept } = withdrawalsApplied(await readSessionEvents(tx, id));
          const verdict = canReprepare(locked.status, {
            beyondUsePassed: current !== null && current.beyondUseAt.getTime() <= now,
            infusionStarted: kept.some(
              (e) => e.type === 'step-started' && e.stepId === infusionStepId,
            ),
          });
          if (!verdict.allowed)
            throw AppError.conflict(
              'not_checked',
              `Order ${id} is ${locked.status}; preparation follows a matching dose check, and ${verdict.why}.`,
            );
          previous = current ? { beyondUseAt: current.beyondUseAt.toISOString() } : null;
        } else if (!locked) {
          throw AppError.conflict(
            'not_checked',
            `Order ${id} is gone; preparation follows a matching dose check.`,
          );
        }
        const lot =
          fromStock === null
            ? null
            : await deps.stock.issue(tx, {
                product: drug.name,
                lotId: fromStock.lotId,
                vials: stockFigures.vialsOpened,
                actorId: actor.id,
                orderId: id,
              });
        const saved = await orders.addPreparation(tx, {
          orderId: id,
          pharmacistId: actor.id,
          vialLot: lot?.lot ?? entry.vialLot!,
          vialExpiry: lot?.expiry ?? entry.vialExpiry!,
          reconstitutedAt,
          volumeDrawnMl: entry.volumeDrawnMl,
          beyondUseAt,
        });
        issued = {
          stockLotId: lot?.id ?? null,
          vialLot: saved.vialLot,
          vialExpiry: saved.vialExpiry,
        };
        await deps.stock.recordPreparationStock(tx, {
          preparationId: saved.id,
          orderId: id,
          stockLotId: lot?.id ?? null,
          vialsOpened: stockFigures.vialsOpened,
          doseMg: order.plan.doseMg ?? 0,
          discardedMg: stockFigures.discardedMg,
          discardReason: stockFigures.discardReason,
        });
        if (!previous) await moveOrderStatus(tx, id, 'checked', 'prepared', { beyondUseAt });
        else await orders.update(tx, id, { beyondUseAt });
        await addParticipant(tx, id, actor.id, 'prepared');
        return previous;
      });
      await audit.append({
        actorUserId: actor.id,
        action: discarded ? 'order.re-prepared' : 'order.prepared',
        entityType: 'order',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: {
          ...issued,
          vialsOpened: stockFigures.vialsOpened,
          discardedMg: stockFigures.discardedMg,
          discardReason: stockFigures.discardReason,
          reconstitutedAt: reconstitutedAt.toISOString(),
          volumeDrawnMl: entry.volumeDrawnMl,
          beyondUseAt: beyondUseAt.toISOString(),
          ...(discarded ? { discardedBeyondUseAt: discarded.beyondUseAt } : {}),
        },
      });
      return orderService.detail(id, actor);
    },
  };
}

export type PharmacyService = ReturnType<typeof createPharmacyService>;
