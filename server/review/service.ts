import { pChart, pChartSignalWords, type PChartPoint } from '../../shared/engine/proportions';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Writable } from 'node:stream';
import { DateTime } from 'luxon';
import type {
  AuditFilter,
  AuditTrailQuery,
  DoseRecordFilter,
  ReviewClassification,
} from '../../shared/schemas/reviews';
import type { AuditRepository } from '../audit/repository';
import type { Reader, ReadAudit } from '../audit/service';
import type { Clock } from '../clock';
import type { Transaction, UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import { moveOrderStatus } from '../orders/repository';
import { statusAfterReview } from '../../shared/orders/lifecycle';
import type { Actor } from '../orders/service';
import type { SessionService } from '../sessions/service';
import { csvLine, csvReading as reading, isoInZone } from './csv';
import type { DateRange, ReviewRepository } from './repository';

/** A figure read out of the record's JSON: null stays empty. */
const jsonNumber = (value: unknown) =>
  value === null || value === undefined || value === 'null' ? null : Number(value);

export function createReviewService(deps: {
  unitOfWork: UnitOfWork;
  clock: Clock;
  reviews: ReviewRepository;
  sessions: SessionService;
  audit: AuditRepository;
  reads: ReadAudit;
  unitTimeZone: string;
}) {
  const { unitOfWork, clock, reviews, audit } = deps;
  const zone = deps.unitTimeZone;

  /** Calendar days of the unit to a half-open UTC range. */
  function rangeOf(filter: { from?: string; to?: string }): DateRange {
    return {
      from: filter.from
        ? DateTime.fromISO(filter.from, { zone }).startOf('day').toJSDate()
        : undefined,
      to: filter.to
        ? DateTime.fromISO(filter.to, { zone }).plus({ days: 1 }).startOf('day').toJSDate()
        : undefined,
    };
  }

  const iso = (value: Date | string | null) => isoInZone(value, zone);

  async function mustFindDeviation(id: number) {
    const deviation = await reviews.findDeviation(id);
    if (!deviation || deviation.withdrawnAt)
      throw AppError.notFound(`There is no deviation ${id}.`);
    return deviation;
  }

  async function tookPart(actorId: number, orderId: number) {
    return (await reviews.participantsOf(orderId)).some((p) => p.userId === actorId);
  }

  /** Brings the order's status in line with its deviations' review (shared/orders/lifecycle). */
  async function settleOrderStatus(tx: Transaction, orderId: number) {
    const state = await reviews.reviewStateOf(tx, orderId);
    if (!state) return;
    const next = statusAfterReview(state.status, {
      sessionOutcome: state.outcome === 'stopped' ? 'stopped' : 'completed',
      openDeviations: state.openDeviations,
    });
    await moveOrderStatus(tx, orderId, state.status, next);
  }

  return {
    async queue(filter: AuditFilter) {
      const { rows, total } = await reviews.deviationPage(filter, rangeOf(filter));
      return {
        deviations: rows.map((r) => ({
          ...r,
          detectedAt: iso(r.detectedAt),
          reviewedAt: iso(r.reviewedAt),
        })),
        total,
        page: filter.page,
        pageSize: filter.pageSize,
      };
    },

    async detail(id: number, actor: Actor) {
      const deviation = await mustFindDeviation(id);
      const [history, participants, session] = await Promise.all([
        reviews.reviewsOf(id),
        reviews.participantsOf(deviation.orderId),
        deps.sessions.state(deviation.orderId),
      ]);
      return {
        deviation: {
          ...deviation,
          detectedAt: iso(deviation.detectedAt),
          reviewedAt: iso(deviation.reviewedAt),
          withdrawnAt: undefined,
        },
        history: history.map((h) => ({ ...h, createdAt: iso(h.createdAt) })),
        participants,
        session,
        canReview: !participants.some((p) => p.userId === actor.id),
      };
    },

    async close(
      actor: Actor,
      id: number,
      input: { classification: ReviewClassification; comment: string },
    ) {
      const deviation = await mustFindDeviation(id);
      if (await tookPart(actor.id, deviation.orderId))
        throw AppError.forbidden('You took part in this session, so someone else must review it.');
      await unitOfWork(async (tx) => {
        const locked = await reviews.lockDeviation(tx, id);
        if (locked?.reviewStatus !== 'open')
          throw AppError.conflict(
            'already_closed',
            'This deviation is closed already; reopen it to change the judgement.',
          );
        await reviews.judge(
          tx,
          id,
          {
            reviewStatus: 'closed',
            classification: input.classification,
            reviewedBy: actor.id,
            reviewedAt: clock.now(),
          },
          {
            reviewerId: actor.id,
            action: 'closed',
            classification: input.classification,
            comment: input.comment,
          },
        );
        await settleOrderStatus(tx, deviation.orderId);
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'deviation.closed',
        entityType: 'deviation',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: {
          orderId: deviation.orderId,
          type: deviation.type,
          classification: input.classification,
        },
      });
      return this.detail(id, actor);
    },

    async reopen(actor: Actor, id: number, comment: string) {
      const deviation = await mustFindDeviation(id);
      if (await tookPart(actor.id, deviation.orderId))
        throw AppError.forbidden('You took part in this session, so someone else must review it.');
      await unitOfWork(async (tx) => {
        const locked = await reviews.lockDeviation(tx, id);
        if (locked?.reviewStatus !== 'closed')
          throw AppError.conflict('not_closed', 'Only a closed deviation can be reopened.');
        // The earlier judgement stays in the history; the row shows the current state.
        await reviews.judge(
          tx,
          id,
          { reviewStatus: 'open', classification: null, reviewedBy: null, reviewedAt: null },
          { reviewerId: actor.id, action: 'reopened', classification: null, comment },
        );
        await settleOrderStatus(tx, deviation.orderId);
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'deviation.reopened',
        entityType: 'deviation',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: { orderId: deviation.orderId, comment },
      });
      return this.detail(id, actor);
    },

    async doseRecords(filter: DoseRecordFilter) {
      const { rows, total } = await reviews.recordPage(filter, rangeOf(filter));
      return {
        records: rows.map((r) => ({
          ...r,
          startedAt: iso(r.startedAt),
          endedAt: iso(r.endedAt),
          doseMg: r.doseMg === null ? null : Number(r.doseMg),
          plannedFluenceJPerCm2:
            r.plannedFluenceJPerCm2 === null ? null : Number(r.plannedFluenceJPerCm2),
        })),
        total,
        page: filter.page,
        pageSize: filter.pageSize,
      };
    },

    async trends(filter: { from?: string; to?: string; protocol?: string }) {
      const rows = await reviews.monthly({
        fromMonth: filter.from?.slice(0, 7),
        toMonth: filter.to?.slice(0, 7),
        protocol: filter.protocol,
      });
      const months = rows.map((r) => {
        const sessions = Number(r.sessions);
        const withDeviation = Number(r.sessionsWithDeviation);
        return {
          month: r.month,
          protocolKey: r.protocolKey,
          protocolVersion: Number(r.protocolVersion),
          protocolTitle: r.protocolTitle,
          sessions,
          sessionsWithDeviation: withDeviation,
          ratePct: sessions ? Math.round((withDeviation / sessions) * 1000) / 10 : 0,
        };
      });
      // Each protocol version's months as a p-chart: 3-sigma limits from each month's own count.
      const limits = new Map<(typeof months)[number], PChartPoint>();
      for (const series of new Set(months.map((m) => `${m.protocolKey}@${m.protocolVersion}`))) {
        const of = months.filter((m) => `${m.protocolKey}@${m.protocolVersion}` === series);
        const chart = pChart(
          of.map((m) => ({ label: m.month, count: m.sessionsWithDeviation, total: m.sessions })),
        );
        of.forEach((m, i) => limits.set(m, chart.points[i]!));
      }
      const pct = (v: number | null) => (v === null ? null : Math.round(v * 1000) / 10);
      return months.map((m) => {
        const point = limits.get(m)!;
        return {
          ...m,
          lowerLimitPct: pct(point.lowerLimit),
          upperLimitPct: pct(point.upperLimit),
          signal: point.signal,
          reading: pChartSignalWords(point),
        };
      });
    },

    /** The deviations behind the trend, split by type and severity, per month and protocol version. */
    async trendsByType(filter: { from?: string; to?: string; protocol?: string }) {
      const rows = await reviews.monthlyByType({
        fromMonth: filter.from?.slice(0, 7),
        toMonth: filter.to?.slice(0, 7),
        protocol: filter.protocol,
      });
      return rows.map((r) => ({
        month: r.month,
        protocolKey: r.protocolKey,
        protocolVersion: Number(r.protocolVersion),
        type: r.type,
        severity: r.severity,
        deviations: Number(r.deviations),
      }));
    },

    async auditTrail(query: AuditTrailQuery) {
      const { rows, total } = await reviews.auditTrail(query, rangeOf(query));
      return {
        events: rows.map((r) => ({
          ...r,
          id: String(r.id),
          occurredAt: iso(r.occurredAt),
          details: typeof r.details === 'string' ? JSON.parse(r.details) : r.details,
        })),
        total,
        page: query.page,
        pageSize: query.pageSize,
      };
    },

    /** The export's file name, dated by the server's clock (UTC day). */
    exportFileName: (kind: 'deviations' | 'dose-records') =>
      `luxtempo-${kind}-${clock.now().toISOString().slice(0, 10)}.csv`,

    /**
     * Streams a CSV of the filtered rows straight from a database cursor: memory stays flat
     * however many rows there are.
     */
    async exportCsv(
      kind: 'deviations' | 'dose-records',
      filter: AuditFilter | DoseRecordFilter,
      out: Writable,
      reader: Reader,
    ) {
      // Every export is a copy of health data leaving the system: recorded before the first row.
      await deps.reads.note(reader, {
        action: 'export.downloaded',
        entityType: 'export',
        entityId: kind,
        details: { export: `${kind}.csv`, filter },
      });
      const query =
        kind === 'deviations'
          ? await reviews.deviationsForExport(filter as AuditFilter, rangeOf(filter))
          : await reviews.recordsForExport(filter as DoseRecordFilter, rangeOf(filter));
      const columns: [string, (r: Record<string, unknown>) => unknown][] =
        kind === 'deviations'
          ? [
              ['deviation_id', (r) => r.id],
              ['order_id', (r) => r.orderId],
              ['detected_at (ISO 8601)', (r) => iso(r.detectedAt as Date)],
              ['protocol', (r) => r.protocolKey],
              ['protocol_version', (r) => r.protocolVersion],
              ['patient_record_number', (r) => r.recordNumber],
              ['eye', (r) => r.eye],
              ['type', (r) => r.type],
              ['severity', (r) => r.severity],
              ['expected', (r) => r.expected],
              ['actual', (r) => r.actual],
              ['unit', (r) => r.unit],
              ['message', (r) => r.message],
              ['review_status', (r) => r.reviewStatus],
              ['classification', (r) => r.classification],
              ['reviewed_by', (r) => r.reviewedBy],
              ['reviewed_at (ISO 8601)', (r) => iso(r.reviewedAt as Date | null)],
              ['review_comment', (r) => r.reviewComment],
            ]
          : [
              ['order_id', (r) => r.orderId],
              ['protocol', (r) => r.protocolKey],
              ['protocol_version', (r) => r.protocolVersion],
              ['kind', (r) => r.kind],
              ['patient_record_number', (r) => r.recordNumber],
              ['eye', (r) => r.eye],
              ['outcome', (r) => r.outcome],
              ['started_at (ISO 8601)', (r) => iso(r.startedAt as Date | null)],
              ['ended_at (ISO 8601)', (r) => iso(r.endedAt as Date | null)],
              // Figures at the precision they are read at (shared/format/precision).
              ['planned_dose (mg)', (r) => reading('doseMg', r.doseMg)],
              ['volume_given (mL)', (r) => reading('volumeMl', r.volumeGivenMl)],
              ['light_on_time (s)', (r) => reading('durationS', r.onTimeS)],
              [
                'planned_fluence (J/cm²)',
                (r) => reading('fluenceJPerCm2', r.plannedFluenceJPerCm2),
              ],
              [
                'delivered_fluence (J/cm²)',
                (r) => reading('fluenceJPerCm2', r.deliveredFluenceJPerCm2),
              ],
              ['fluence_basis', (r) => r.fluenceBasis ?? 'planned'],
              ['device', (r) => r.deviceName],
              ['device_serial', (r) => r.deviceSerial],
              ['lens', (r) => r.lensName],
              ['lens_laser_spot_factor', (r) => jsonNumber(r.lensFactor)],
              ['power_set (mW)', (r) => jsonNumber(r.powerSetMw)],
              ['spot_set (µm)', (r) => jsonNumber(r.spotSetUm)],
              ['irradiance_set (mW/cm²)', (r) => jsonNumber(r.irradianceSetMwPerCm2)],
              ['irradiance_measured (mW/cm²)', (r) => jsonNumber(r.measuredIrradianceMwPerCm2)],
              ['deviations', (r) => r.deviationCount],
            ];
      out.write(csvLine(columns.map(([name]) => name)));
      await reviews.streamRows(query, async (rows) => {
        const toCsv = new Transform({
          objectMode: true,
          transform(row: Record<string, unknown>, _enc, done) {
            done(null, csvLine(columns.map(([, get]) => get(row))));
          },
        });
        await pipeline(rows, toCsv, out);
      });
    },
  };
}

export type ReviewService = ReturnType<typeof createReviewService>;
