import { DateTime } from 'luxon';
import { eyeOutcome, summariseOutcomes } from '../../shared/engine/follow-up-outcome';
import { pChart, pChartSignalWords } from '../../shared/engine/proportions';
import type { OutcomesQuery } from '../../shared/schemas/follow-up';
import type { Clock } from '../clock';
import { csvLine } from '../review/csv';
import type { FollowUpRepository } from './repository';
import { followUpPlanOf } from './service';

/** Outcomes per protocol for a period of treatment months, with monthly p-charts. */
export function createOutcomeService(deps: {
  clock: Clock;
  followUps: FollowUpRepository;
  planMissing: () => Promise<number>;
  unitTimeZone: string;
}) {
  const { clock, followUps, unitTimeZone } = deps;

  async function outcomes(query: OutcomesQuery) {
    await deps.planMissing();
    const today = DateTime.fromJSDate(clock.now(), { zone: unitTimeZone }).toISODate()!;
    const [eyes, versions] = await Promise.all([
      followUps.treatedEyes({ fromMonth: query.from, toMonth: query.to, protocol: query.protocol }),
      followUps.protocolVersions(),
    ]);
    const orderIds = eyes.map((e) => e.orderId);
    const [visits, complications] = await Promise.all([
      followUps.visitsOfOrders(orderIds),
      followUps.complicationsOfOrders(orderIds),
    ]);
    const versionOfKey = new Map<string, number>();
    for (const v of versions) versionOfKey.set(`${v.key}`, v.id);
    const judged = eyes.map((eye) => {
      const own = visits.filter((v) => v.orderId === eye.orderId);
      const planVersion = eye.planProtocolVersionId ?? versionOfKey.get(eye.protocolKey) ?? 0;
      const found = followUpPlanOf(versions, planVersion);
      const result = found
        ? eyeOutcome(
            found.plan.outcome,
            own.map((v) => ({
              visitKey: v.visitKey,
              recorded: v.recordedAt !== null,
              dueOn: v.dueOn,
              windowDays: v.windowDays,
              acuityLogMar: v.acuityLogMar,
              subretinalFluid: v.subretinalFluid,
              kmaxD: v.kmaxD,
            })),
            today,
          )
        : { outcome: 'not-assessable' as const, acuityChangeLogMar: null, kmaxChangeD: null };
      return {
        ...eye,
        ...result,
        outcomeLabel: found?.plan.outcome.label ?? null,
        complications: complications.filter((c) => c.orderId === eye.orderId).length,
      };
    });

    const keys = [...new Set(judged.map((e) => e.protocolKey))].sort();
    const protocols = keys.map((key) => {
      const of = judged.filter((e) => e.protocolKey === key);
      return {
        protocolKey: key,
        protocolTitle: of[0]!.protocolTitle,
        kind: of[0]!.kind,
        outcomeLabel: of.find((e) => e.outcomeLabel)?.outcomeLabel ?? null,
        ...summariseOutcomes(of),
      };
    });

    const months = [...new Set(judged.map((e) => e.localMonth))].sort();
    const perMonth = (
      count: (e: (typeof judged)[number]) => boolean,
      among = (_e: (typeof judged)[number]) => true,
    ) =>
      pChart(
        months.map((month) => {
          const of = judged.filter((e) => e.localMonth === month && among(e));
          return { label: month, count: of.filter(count).length, total: of.length };
        }),
      );
    const charts = [
      {
        id: 'deviations',
        title: 'Sessions with a deviation',
        chart: perMonth((e) => e.deviationCount > 0),
      },
      {
        id: 'complications',
        title: 'Treated eyes with a complication',
        chart: perMonth((e) => e.complications > 0),
      },
      {
        id: 'outcome',
        title: 'Eyes reaching the outcome, of those assessed',
        chart: perMonth(
          (e) => e.outcome === 'reached',
          (e) => e.outcome === 'reached' || e.outcome === 'not-reached',
        ),
      },
    ].map((c) => ({
      ...c,
      points: c.chart.points.map((p) => ({ ...p, words: pChartSignalWords(p) })),
      centre: c.chart.centre,
      chart: undefined,
    }));

    return {
      today,
      filter: query,
      protocols,
      charts,
      eyes: judged.map((e) => ({
        orderId: e.orderId,
        month: e.localMonth,
        protocolKey: e.protocolKey,
        eye: e.eye,
        outcome: e.outcome,
        acuityChangeLogMar: e.acuityChangeLogMar,
        kmaxChangeD: e.kmaxChangeD,
        complications: e.complications,
      })),
    };
  }

  return {
    outcomes,

    /** One CSV row per protocol: the table on the Outcomes screen, with its intervals. */
    async outcomesCsv(query: OutcomesQuery): Promise<string> {
      const answer = await outcomes(query);
      const head = csvLine([
        'protocol_key',
        'protocol_title',
        'outcome',
        'treated_eyes',
        'reached',
        'not_reached',
        'lost_to_follow_up',
        'pending',
        'not_assessable',
        'share_reached',
        'share_ci95_lower',
        'share_ci95_upper',
        'share_if_lost_failed',
        'mean_acuity_change_logmar',
        'mean_acuity_change_letters',
        'acuity_pairs',
        'eyes_with_complication',
        'complication_rate',
        'complication_ci95_lower',
        'complication_ci95_upper',
      ]);
      const r4 = (v: number | null) => (v === null ? null : Math.round(v * 10000) / 10000);
      return (
        head +
        answer.protocols
          .map((p) =>
            csvLine([
              p.protocolKey,
              p.protocolTitle,
              p.outcomeLabel,
              p.treatedEyes,
              p.reached,
              p.notReached,
              p.lostToFollowUp,
              p.pending,
              p.notAssessable,
              r4(p.share.share),
              r4(p.share.lower),
              r4(p.share.upper),
              r4(p.shareIfLostFailed.share),
              p.meanAcuityChangeLogMar,
              p.meanAcuityChangeLetters,
              p.acuityPairs,
              p.eyesWithComplication,
              r4(p.complicationRate.share),
              r4(p.complicationRate.lower),
              r4(p.complicationRate.upper),
            ]),
          )
          .join('')
      );
    },
  };
}

export type OutcomeService = ReturnType<typeof createOutcomeService>;
