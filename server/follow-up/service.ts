import { DateTime } from 'luxon';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import { acuityFromEntry, lettersFromLogMar } from '../../shared/engine/visual-acuity';
import { formatCalendarDate } from '../../shared/format/figures';
import type { FollowUpPlan } from '../../shared/protocol/protocol-schema';
import type { RecordComplication, RecordVisit } from '../../shared/schemas/follow-up';
import type { AuditRepository } from '../audit/repository';
import { storeReport } from '../attachments/service';
import type { Clock } from '../clock';
import type { Complication } from '../db/entities/complication';
import type { FollowUpVisit } from '../db/entities/follow-up-visit';
import type { UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import { enqueueMessage } from '../mail/outbox-repository';
import type { Actor } from '../orders/service';
import type { EndedTreatmentQueries, FollowUpRepository, VisitFindings } from './repository';

type VersionRow = Awaited<ReturnType<FollowUpRepository['protocolVersions']>>[number];

/** Where a visit stands on a given day of the unit's calendar. */
export type VisitState = 'recorded' | 'planned' | 'due' | 'overdue' | 'missed';

export function visitState(
  visit: Pick<FollowUpVisit, 'recordedAt' | 'dueOn' | 'windowDays'>,
  today: string,
): VisitState {
  if (visit.recordedAt) return 'recorded';
  if (visit.dueOn > today) return 'planned';
  if (visit.dueOn === today) return 'due';
  const lastDay = DateTime.fromISO(visit.dueOn).plus({ days: visit.windowDays }).toISODate()!;
  return today > lastDay ? 'missed' : 'overdue';
}

/** Reads a keyset-paged query to its end: pages of `size` after the last key, until a short page. */
async function everyPage<T>(
  page: (afterKey: number, size: number) => Promise<T[]>,
  keyOf: (row: T) => number,
  size: number,
): Promise<T[]> {
  const rows: T[] = [];
  for (let afterKey = 0; ;) {
    const next = await page(afterKey, size);
    rows.push(...next);
    if (next.length < size) return rows;
    afterKey = keyOf(next[next.length - 1]!);
  }
}

/**
 * The follow-up block a treatment is planned from: its own protocol version's, or, for a version
 * approved before follow-up fields existed, the newest approved version of the same protocol
 * that has one (the same treatment, described later).
 */
export function followUpPlanOf(
  versions: VersionRow[],
  protocolVersionId: number,
): { versionId: number; key: string; version: number; plan: FollowUpPlan } | null {
  const own = versions.find((v) => v.id === protocolVersionId);
  if (!own) return null;
  if (own.definition.followUp)
    return { versionId: own.id, key: own.key, version: own.version, plan: own.definition.followUp };
  const successor = versions
    .filter((v) => v.key === own.key && v.status === 'approved' && v.definition.followUp)
    .sort((a, b) => b.version - a.version)[0];
  return successor?.definition.followUp
    ? {
        versionId: successor.id,
        key: successor.key,
        version: successor.version,
        plan: successor.definition.followUp,
      }
    : null;
}

export function toVisitDto(
  visit: FollowUpVisit,
  today: string,
  attachments: { id: number; fileName: string; visitId: number | null }[] = [],
) {
  return {
    id: visit.id,
    orderId: visit.orderId,
    eye: visit.eye,
    kind: visit.kind,
    visitKey: visit.visitKey,
    label: visit.visitLabel,
    offsetDays: visit.offsetDays,
    dueOn: visit.dueOn,
    windowDays: visit.windowDays,
    state: visitState(visit, today),
    seenOn: visit.seenOn,
    recordedAt: visit.recordedAt?.toISOString() ?? null,
    acuity:
      visit.acuityLogMar === null
        ? null
        : {
            notation: visit.acuityNotation,
            entry: visit.acuityEntry,
            logMar: visit.acuityLogMar,
            letters: lettersFromLogMar(visit.acuityLogMar),
          },
    pdt:
      visit.kind === 'pdt' && visit.recordedAt
        ? {
            centralSubfieldThicknessUm: visit.centralSubfieldThicknessUm,
            subretinalFluid: visit.subretinalFluid,
            leakage: visit.leakage,
            retreatmentDecision: visit.retreatmentDecision,
          }
        : null,
    cxl:
      visit.kind === 'cxl' && visit.recordedAt
        ? {
            kmaxD: visit.kmaxD,
            thinnestPachymetryUm: visit.thinnestPachymetryUm,
            endothelialCellsPerMm2: visit.endothelialCellsPerMm2,
            hazeGrade: visit.hazeGrade,
          }
        : null,
    note: visit.note,
    attachments: attachments
      .filter((a) => a.visitId === visit.id)
      .map((a) => ({ id: a.id, fileName: a.fileName })),
  };
}

export function toComplicationDto(c: Complication) {
  return {
    id: c.id,
    orderId: c.orderId,
    followUpVisitId: c.followUpVisitId,
    eye: c.eye,
    kind: c.kind,
    kindLabel: c.kindLabel,
    severity: c.severity,
    onsetOn: c.onsetOn,
    outcome: c.outcome,
    note: c.note,
    recordedAt: c.recordedAt.toISOString(),
    reviewedAt: c.reviewedAt?.toISOString() ?? null,
  };
}

export function createFollowUpService(deps: {
  unitOfWork: UnitOfWork;
  clock: Clock;
  followUps: FollowUpRepository;
  treatments: EndedTreatmentQueries;
  audit: AuditRepository;
  unitTimeZone: string;
  unitName: string;
  uploadDir: string;
}) {
  const { unitOfWork, clock, followUps, treatments, audit, unitTimeZone, uploadDir } = deps;

  const today = () => DateTime.fromJSDate(clock.now(), { zone: unitTimeZone }).toISODate()!;
  const localDate = (at: Date) => DateTime.fromJSDate(at, { zone: unitTimeZone }).toISODate()!;
  const addDays = (day: string, days: number) => DateTime.fromISO(day).plus({ days }).toISODate()!;

  /** Plans the visits of every completed session that has none yet (of one patient, if given). */
  async function planMissing(patientId?: number): Promise<number> {
    // Page through by order id: a treatment with no follow-up block to plan from stays unplanned,
    // and must never hold the ones after it back.
    const unplanned = await everyPage(
      (afterOrderId, size) => followUps.unplanned(patientId, afterOrderId, size),
      (t) => t.orderId,
      500,
    );
    if (unplanned.length === 0) return 0;
    const versions = await followUps.protocolVersions();
    const kindOf = new Map(versions.map((v) => [v.id, v.definition.kind]));
    const rows = unplanned.flatMap((t) => {
      const found = followUpPlanOf(versions, t.protocolVersionId);
      if (!found) return [];
      const treatedOn = localDate(t.endedAt);
      return found.plan.visits.map((visit) => ({
        orderId: t.orderId,
        patientId: t.patientId,
        eye: t.eye,
        kind: kindOf.get(t.protocolVersionId) ?? 'pdt',
        planProtocolVersionId: found.versionId,
        visitKey: visit.id,
        visitLabel: visit.label,
        offsetDays: visit.offsetDays,
        dueOn: addDays(treatedOn, visit.offsetDays),
        windowDays: found.plan.visitWindowDays,
      }));
    });
    await followUps.insertPlanned(rows);
    return unplanned.length;
  }

  /** E-mails (through the outbox) patients who consent, a protocol's lead time before each visit. */
  async function queueReminders(): Promise<number> {
    const day = today();
    const versions = await followUps.protocolVersions();
    const leadOf = new Map(
      versions.map((v) => [v.id, v.definition.followUp?.reminderDaysBefore ?? null]),
    );
    const longestLead = Math.max(0, ...[...leadOf.values()].map((lead) => lead ?? 0));
    // Every due reminder is queued, however many: page through the candidates by id.
    const candidates = await everyPage(
      (afterId, size) =>
        followUps.reminderCandidates(day, addDays(day, longestLead), afterId, size),
      (visit) => visit.id,
      200,
    );
    let queued = 0;
    for (const visit of candidates) {
      const lead = leadOf.get(Number(visit.planProtocolVersionId));
      if (lead === null || lead === undefined || visit.dueOn > addDays(day, lead)) continue;
      const sent = await unitOfWork(async (tx) => {
        if (!(await followUps.markReminderQueued(tx, visit.id, clock.now()))) return false;
        const dueText = formatCalendarDate(visit.dueOn, 'day');
        await enqueueMessage(tx, {
          kind: 'follow-up-reminder',
          recipients: [visit.email],
          subject: `${deps.unitName}: your follow-up visit on ${dueText}`,
          body: [
            `Dear ${visit.givenName},`,
            '',
            `Your ${visit.visitLabel} follow-up visit for your ${visit.eye} eye is due on ${dueText}.`,
            'If you cannot come, please call the unit to arrange another day.',
            '',
            deps.unitName,
          ].join('\n'),
          related: { type: 'follow-up-visit', id: visit.id },
        });
        return true;
      });
      if (sent) queued += 1;
    }
    return queued;
  }

  async function mustFindTreatment(orderId: number) {
    const treatment = await treatments.ofOrder(orderId);
    if (!treatment)
      throw AppError.conflict(
        'no_treatment',
        `Order ${orderId} has no completed or stopped session; follow-up is recorded after a treatment.`,
      );
    return treatment;
  }

  return {
    planMissing,
    queueReminders,

    /** Plans what is missing, then queues reminders that are due: run on reads and after a session. */
    async sweep() {
      await planMissing();
      await queueReminders();
    },

    /** Every ended treatment of a patient with its visits, kinds of complication and complications. */
    async ofPatient(patientId: number) {
      await planMissing(patientId);
      const [ended, visits, complications, versions] = await Promise.all([
        treatments.ofPatient(patientId),
        followUps.visitsOfPatient(patientId),
        followUps.complicationsOfPatient(patientId),
        followUps.protocolVersions(),
      ]);
      const attachments = (await followUps.attachmentsOfVisits(visits.map((v) => v.id))).map(
        (a) => ({ id: a.id, fileName: a.fileName, visitId: a.followUpVisitId }),
      );
      const day = today();
      return {
        today: day,
        treatments: ended.map((t) => {
          const found = followUpPlanOf(versions, t.protocolVersionId);
          return {
            orderId: t.orderId,
            eye: t.eye,
            kind: t.kind,
            sessionOutcome: t.outcome,
            treatedOn: localDate(t.endedAt),
            protocol: { key: t.protocolKey, version: t.protocolVersion, title: t.protocolTitle },
            planFrom: found ? { key: found.key, version: found.version } : null,
            outcomeLabel: found?.plan.outcome.label ?? null,
            complicationKinds: found?.plan.complicationKinds ?? [],
            visits: visits
              .filter((v) => v.orderId === t.orderId)
              .map((v) => toVisitDto(v, day, attachments)),
            complications: complications
              .filter((c) => c.orderId === t.orderId)
              .map(toComplicationDto),
          };
        }),
      };
    },

    /** Records a planned visit once, with the findings of its treatment's kind. */
    async record(actor: Actor, visitId: number, input: RecordVisit) {
      const visit = await followUps.findVisit(visitId);
      if (!visit) throw AppError.notFound(`There is no follow-up visit ${visitId}.`);
      if (visit.recordedAt)
        throw AppError.conflict(
          'visit_recorded',
          `The ${visit.visitLabel} visit was recorded already on ${visit.seenOn}; nothing was changed.`,
        );
      const problems: { path: string; message: string }[] = [];
      const treatedOn = addDays(visit.dueOn, -visit.offsetDays);
      const day = today();
      if (input.seenOn < treatedOn || input.seenOn > day)
        problems.push({
          path: 'seenOn',
          message: `seenOn must lie between the treatment (${treatedOn}) and today (${day})`,
        });
      const own = visit.kind;
      const other = own === 'pdt' ? 'cxl' : 'pdt';
      if (!input[own])
        problems.push({
          path: own,
          message: `${own} findings are required for a ${own === 'pdt' ? 'PDT' : 'cross-linking'} visit`,
        });
      if (input[other])
        problems.push({
          path: other,
          message: `${other} findings do not belong to a ${own === 'pdt' ? 'PDT' : 'cross-linking'} visit`,
        });
      let acuity: ReturnType<typeof acuityFromEntry> | null = null;
      try {
        acuity = acuityFromEntry(input.acuity, 'acuity.value');
      } catch (error) {
        if (!(error instanceof PlanInputError)) throw error;
        problems.push(...error.fields);
      }
      if (problems.length > 0 || !acuity)
        throw AppError.badRequest(
          `The visit was not recorded: ${problems.map((p) => p.message).join('; ')}.`,
          problems,
        );
      const findings: VisitFindings = {
        seenOn: input.seenOn,
        acuityNotation: acuity.notation,
        acuityEntry: acuity.entry,
        acuityLogMar: acuity.logMar,
        centralSubfieldThicknessUm: input.pdt?.centralSubfieldThicknessUm ?? null,
        subretinalFluid: input.pdt?.subretinalFluid ?? null,
        leakage: input.pdt?.leakage ?? null,
        retreatmentDecision: input.pdt?.retreatmentDecision ?? null,
        kmaxD: input.cxl?.kmaxD ?? null,
        thinnestPachymetryUm: input.cxl?.thinnestPachymetryUm ?? null,
        endothelialCellsPerMm2: input.cxl?.endothelialCellsPerMm2 ?? null,
        hazeGrade: input.cxl?.hazeGrade ?? null,
        note: input.note?.trim() || null,
      };
      if (!(await followUps.recordVisit(visitId, findings, actor.id, clock.now())))
        throw AppError.conflict(
          'visit_recorded',
          `Someone recorded the ${visit.visitLabel} visit a moment ago; nothing was changed.`,
        );
      await audit.append({
        actorUserId: actor.id,
        action: 'follow-up.recorded',
        entityType: 'order',
        entityId: visit.orderId,
        ipAddress: actor.ipAddress,
        details: { visitId, visitKey: visit.visitKey, acuity: acuity.entry, logMar: acuity.logMar },
      });
      const saved = (await followUps.findVisit(visitId))!;
      return { visit: toVisitDto(saved, day), working: acuity.working };
    },

    /** Attaches a report (OCT, topography) to a visit, checked as an order's reports are. */
    async attach(actor: Actor, visitId: number, file: { originalname: string; buffer: Buffer }) {
      const visit = await followUps.findVisit(visitId);
      if (!visit) throw AppError.notFound(`There is no follow-up visit ${visitId}.`);
      const stored = await storeReport(uploadDir, file);
      const saved = await followUps.addAttachment({
        orderId: visit.orderId,
        followUpVisitId: visit.id,
        ...stored,
        uploadedBy: actor.id,
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'attachment.added',
        entityType: 'order',
        entityId: visit.orderId,
        ipAddress: actor.ipAddress,
        details: {
          attachmentId: saved.id,
          visitId,
          fileName: stored.fileName,
          sha256: stored.sha256,
        },
      });
      return { id: saved.id, fileName: stored.fileName, sizeBytes: stored.sizeBytes };
    },

    /** Adds a complication to the register, of a kind the treatment's protocol lists. */
    async addComplication(actor: Actor, input: RecordComplication) {
      const treatment = await treatments.ofOrder(input.orderId);
      if (!treatment)
        throw AppError.badRequest(
          `Order ${input.orderId} has no completed or stopped session; nothing was saved.`,
          [{ path: 'orderId', message: 'orderId must name a treatment whose session has ended' }],
        );
      const versions = await followUps.protocolVersions();
      const found = followUpPlanOf(versions, treatment.protocolVersionId);
      const kinds = found?.plan.complicationKinds ?? [];
      const problems: { path: string; message: string }[] = [];
      const kind = kinds.find((k) => k.id === input.kind);
      if (!kind)
        problems.push({
          path: 'kind',
          message: `kind must be one of the protocol's complications (${kinds.map((k) => k.id).join(', ')})`,
        });
      const treatedOn = localDate(treatment.endedAt);
      const day = today();
      if (input.onsetOn < treatedOn || input.onsetOn > day)
        problems.push({
          path: 'onsetOn',
          message: `onsetOn must lie between the treatment (${treatedOn}) and today (${day})`,
        });
      if (input.followUpVisitId) {
        const visit = await followUps.findVisit(input.followUpVisitId);
        if (!visit || visit.orderId !== input.orderId)
          problems.push({
            path: 'followUpVisitId',
            message: `followUpVisitId must name a follow-up visit of order ${input.orderId}`,
          });
      }
      if (problems.length > 0 || !kind)
        throw AppError.badRequest(
          `The complication was not saved: ${problems.map((p) => p.message).join('; ')}.`,
          problems,
        );
      const saved = await followUps.addComplication({
        orderId: input.orderId,
        followUpVisitId: input.followUpVisitId ?? null,
        patientId: treatment.patientId,
        eye: treatment.eye,
        kind: kind.id,
        kindLabel: kind.label,
        severity: input.severity,
        onsetOn: input.onsetOn,
        outcome: input.outcome,
        note: input.note?.trim() || null,
        recordedBy: actor.id,
        recordedAt: clock.now(),
        reviewedBy: null,
        reviewedAt: null,
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'complication.recorded',
        entityType: 'order',
        entityId: input.orderId,
        ipAddress: actor.ipAddress,
        details: { complicationId: saved.id, kind: kind.id, severity: input.severity },
      });
      return toComplicationDto(saved);
    },

    /** Complications waiting for the auditor, oldest first. */
    async reviewQueue() {
      return (await followUps.complicationsToReview(200)).map(toComplicationDto);
    },

    async markReviewed(actor: Actor, id: number) {
      const row = await followUps.findComplication(id);
      if (!row) throw AppError.notFound(`There is no complication ${id}.`);
      if (!(await followUps.markComplicationReviewed(id, actor.id, clock.now())))
        throw AppError.conflict(
          'complication_reviewed',
          `Complication ${id} was reviewed already.`,
        );
      await audit.append({
        actorUserId: actor.id,
        action: 'complication.reviewed',
        entityType: 'order',
        entityId: row.orderId,
        ipAddress: actor.ipAddress,
        details: { complicationId: id },
      });
      return toComplicationDto((await followUps.findComplication(id))!);
    },

    /** Planned visits past their due date and not recorded, for the clinician's Today: theirs first. */
    async overdue(clinicianId: number) {
      await planMissing();
      await queueReminders();
      const day = today();
      return (await followUps.overdue(day, 100, clinicianId)).map((v) => ({
        ...v,
        daysOverdue: Math.round(DateTime.fromISO(day).diff(DateTime.fromISO(v.dueOn), 'days').days),
      }));
    },

    /** The latest recorded retreatment decision for an eye (the retreatment-interval warning names it). */
    async latestDecision(patientId: number, eye: 'right' | 'left', kind: 'pdt' | 'cxl') {
      const visit = await followUps.latestDecision(patientId, eye, kind);
      return visit?.retreatmentDecision && visit.seenOn
        ? {
            decision: visit.retreatmentDecision,
            seenOn: visit.seenOn,
            visitLabel: visit.visitLabel,
          }
        : null;
    },

    mustFindTreatment,
    today,
  };
}

export type FollowUpService = ReturnType<typeof createFollowUpService>;
