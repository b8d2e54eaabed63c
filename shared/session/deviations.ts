import { fluenceJPerCm2 } from '../engine/light-arithmetic';
import { formatNumber, roundToStep } from '../engine/rounding';
import { exceeds, withinAbs, withinPct } from '../engine/tolerance';
import { formatDuration, formatUnitTime } from '../format/figures';
import { formatReading } from '../format/precision';
import type { ProtocolVersion } from '../protocol/protocol-schema';
import type { DosePlan } from '../schemas/calculation';
import type { ChecklistAnswer } from '../schemas/orders';
import type { DoseRecord } from './dose-record';
import { deviationTypes, type Deviation, type DeviationSeverity } from './session-events';

export interface PreparationTimes {
  reconstitutedAt: string;
  beyondUseAt: string;
}

export interface DeviationInput {
  protocol: ProtocolVersion;
  plan: DosePlan;
  record: DoseRecord;
  checklist: readonly ChecklistAnswer[];
  preparation: PreparationTimes | null;
  /** The unit's IANA zone: times in the messages read on its clock, with its short name (UTC if not given). */
  unitTimeZone?: string;
}

function outside(actual: number, expected: number, tolerance: number): boolean {
  return !withinAbs(actual, expected, tolerance);
}

/**
 * "83 s", "10 min 59 s", "4 h 1 s": durations as the records and sheets write them (shared/format),
 * with a sign for an early figure and a tenth of a second under a minute.
 */
export function durationText(seconds: number): string {
  const sign = seconds < 0 ? '−' : '';
  const abs = Math.abs(seconds);
  if (abs < 60) return `${sign}${formatNumber(roundToStep(abs, 0.1))} s`;
  return sign + formatDuration(abs, 'words');
}

/** Light times read in seconds, as the device shows them, up to 10 min. */
function lightTimeText(seconds: number): string {
  return Math.abs(seconds) < 600
    ? `${formatNumber(roundToStep(seconds, 0.1))} s`
    : durationText(seconds);
}

/** A moment in a message, on the unit's clock: "3 Dec 2026, 14:05 WET". */
function timeTextIn(zone: string) {
  return (ms: number) => formatUnitTime(new Date(ms).toISOString(), zone, 'record');
}

const msOf = (at: string | null): number | null => {
  if (at === null) return null;
  const ms = Date.parse(at);
  return Number.isFinite(ms) ? ms : null;
};

const round = (value: number, step: number) => roundToStep(value, step);
/**
 * Stored figures keep a millisecond's precision (the taps' own), so that an actual just past its
 * limit never reads the same as the limit; screens round them for reading (shared/format/precision).
 */
const minuteStep = 0.00001;
const hourStep = 0.0000001;

/** Free text quoted in a message is shortened; the full text stays in the record or the order. */
function quoted(text: string): string {
  return text.length > 160 ? `${text.slice(0, 159)}…` : text;
}

/**
 * The deviations from protocol that the record shows, one per type, in the order of
 * `deviationTypes`. Only finished facts are judged: an infusion once it has ended, the light
 * once its step has ended or the session is over; a running figure is never a deviation yet.
 * A tolerance of null in the protocol means the site does not check that figure.
 *
 * Severities (a judgement, kept here in one place):
 * - critical: harm is likely or the drug is not fit to use — a drug past its beyond-use time,
 *   UV on a stroma below the minimum (endothelial damage: Spoerl E et al. Cornea 2007),
 *   extravasation (tissue injury, dose lost), an absolute contraindication overridden;
 * - major: the treatment differs from the regimen in a way that can change its effect —
 *   timing, exposure, fluence, soak, UV-phase drop gaps, a stopped session, a documented
 *   thickness override, the site's own reconstitution limit;
 * - minor: worth an auditor's look, little effect on the dose — a soak-phase drop gap, a
 *   caution answered yes with the clinician's reason (the designed path for a caution).
 */
export function findDeviations({
  protocol,
  plan,
  record,
  checklist,
  preparation,
  unitTimeZone = 'UTC',
}: DeviationInput): Deviation[] {
  const timeText = timeTextIn(unitTimeZone);
  const found = new Map<Deviation['type'], Deviation>();
  const add = (deviation: Deviation) => found.set(deviation.type, deviation);
  const { tolerances } = protocol;
  const sessionOver = record.outcome === 'completed' || record.outcome === 'stopped';
  const infusionStartMs = msOf(record.infusionStartAt);

  // Infusion length: the regimen's light timing assumes the studied infusion (TAP 1999: 10 min).
  const infusionEndMs = msOf(record.infusionEndAt);
  if (
    protocol.drug &&
    tolerances.infusionDurationMin !== null &&
    infusionStartMs !== null &&
    infusionEndMs !== null
  ) {
    const actualS = (infusionEndMs - infusionStartMs) / 1000;
    const expectedS = protocol.drug.infusionMin * 60;
    if (outside(actualS, expectedS, tolerances.infusionDurationMin * 60)) {
      add({
        type: 'infusion-duration',
        severity: 'major',
        expected: protocol.drug.infusionMin,
        actual: round(actualS / 60, minuteStep),
        unit: 'min',
        at: record.infusionEndAt,
        message: `Infusion expected to last ${durationText(expectedS)} (± ${durationText(tolerances.infusionDurationMin * 60)}); it lasted ${durationText(actualS)}${record.extravasationAt ? ', stopped by extravasation' : ''}.`,
      });
    }
  }

  // Light start is timed from the START of the infusion (TAP Study Group, Arch Ophthalmol 1999).
  if (
    protocol.timing &&
    tolerances.lightStartMin !== null &&
    record.lightStartAfterInfusionStartS !== null
  ) {
    const expectedS =
      plan.lightStartAfterInfusionStartS ?? protocol.timing.lightStartAfterInfusionStartMin * 60;
    const actualS = record.lightStartAfterInfusionStartS;
    if (outside(actualS, expectedS, tolerances.lightStartMin * 60)) {
      add({
        type: 'light-start-window',
        severity: 'major',
        expected: round(expectedS / 60, minuteStep),
        actual: round(actualS / 60, minuteStep),
        unit: 'min',
        at: record.lightStartAt,
        message: `Light expected ${durationText(expectedS)} after the start of the infusion (± ${durationText(tolerances.lightStartMin * 60)}); it started ${durationText(actualS)} after, ${durationText(Math.abs(actualS - expectedS))} ${actualS > expectedS ? 'late' : 'early'}.`,
      });
    }
  }

  // A light step with no infusion start on record: the drug may not have been given before the
  // light, or was given at a time nobody recorded (TAP Study Group 1999 times the light from it).
  if (record.lightWithoutInfusion && record.lightStartAt !== null) {
    add({
      type: 'light-without-infusion',
      severity: 'critical',
      expected: null,
      actual: null,
      unit: null,
      at: record.lightStartAt,
      message: `Light expected after a recorded infusion start; the light started at ${timeText(Date.parse(record.lightStartAt))} with no infusion start on record (never tapped, or withdrawn). The light precaution is counted from the latest plausible time.`,
    });
  }

  judgeLight({ protocol, plan, record, sessionOver, add });
  judgeDeviceSettings(protocol, plan, record, add);

  if (preparation && infusionStartMs !== null) {
    const reconstitutedMs = msOf(preparation.reconstitutedAt);
    const beyondUseMs = msOf(preparation.beyondUseAt);
    if (beyondUseMs !== null && infusionStartMs > beyondUseMs) {
      const limitH = reconstitutedMs === null ? null : (beyondUseMs - reconstitutedMs) / 3_600_000;
      add({
        type: 'beyond-use',
        severity: 'critical',
        expected: limitH === null ? null : round(limitH, hourStep),
        actual:
          reconstitutedMs === null
            ? null
            : round((infusionStartMs - reconstitutedMs) / 3_600_000, hourStep),
        unit: 'h',
        at: record.infusionStartAt,
        message: `Infusion expected to start by the drug's beyond-use time, ${timeText(beyondUseMs)}${limitH === null ? '' : ` (${durationText(limitH * 3600)} after reconstitution)`}; it started at ${timeText(infusionStartMs)}, ${durationText((infusionStartMs - beyondUseMs) / 1000)} past it.`,
      });
    }
    const maxH = tolerances.reconstitutionToInfusionMaxH;
    if (maxH !== null && reconstitutedMs !== null) {
      const actualS = (infusionStartMs - reconstitutedMs) / 1000;
      if (exceeds(actualS, maxH * 3600)) {
        add({
          type: 'reconstitution-to-infusion',
          severity: 'major',
          expected: maxH,
          actual: round(actualS / 3600, hourStep),
          unit: 'h',
          at: record.infusionStartAt,
          message: `Infusion expected to start within ${durationText(maxH * 3600)} of reconstitution (${timeText(reconstitutedMs)}); it started ${durationText(actualS)} after.`,
        });
      }
    }
  }

  if (protocol.cxl) judgeCxl(protocol, protocol.cxl, record, add);

  if (record.extravasationAt !== null) {
    const finalMl = protocol.drug?.finalVolumeMl ?? null;
    add({
      type: 'extravasation',
      severity: 'critical',
      expected: finalMl,
      actual: record.volumeGivenMl === null ? null : round(record.volumeGivenMl, 0.01),
      unit: 'mL',
      at: record.extravasationAt,
      message: `Extravasation recorded at ${timeText(Date.parse(record.extravasationAt))}; the infusion was stopped${record.volumeGivenMl === null ? '' : ` with about ${formatReading('volumeMl', record.volumeGivenMl)}${finalMl === null ? '' : ` of ${formatNumber(finalMl)} mL`} given (${record.volumeGivenSource === 'entered' ? 'read off the pump by the nurse' : 'worked out from the planned rate, not measured'})`}${record.doseGivenMg === null || record.plannedDoseMg === null ? '' : `, about ${formatReading('doseMg', record.doseGivenMg)} of ${formatReading('doseMg', record.plannedDoseMg)}`}.`,
    });
  }

  if (record.outcome === 'stopped') {
    const step = protocol.steps.find((s) => s.id === record.stoppedInStepId);
    add({
      type: 'stopped-early',
      severity: 'major',
      expected: null,
      actual: null,
      unit: null,
      at: record.endedAt,
      message: `Session expected to run to the end of the protocol; it was stopped${record.endedAt ? ` at ${timeText(Date.parse(record.endedAt))}` : ''}${step ? ` during "${step.title}"` : ''}. Reason: ${record.stopReason ? quoted(record.stopReason) : 'not given'}.`,
    });
  }

  judgeChecklist(protocol, checklist, record.sessionStartedAt, add);

  return deviationTypes.flatMap((type) => {
    const deviation = found.get(type);
    return deviation ? [deviation] : [];
  });
}

function judgeLight({
  protocol,
  plan,
  record,
  sessionOver,
  add,
}: {
  protocol: ProtocolVersion;
  plan: DosePlan;
  record: DoseRecord;
  sessionOver: boolean;
  add: (d: Deviation) => void;
}): void {
  const isPdt = protocol.kind === 'pdt';
  const startAt = isPdt ? record.lightStartAt : record.uvStartAt;
  const endAt = isPdt ? record.lightEndAt : record.uvEndAt;
  // Judged when the light step has ended, or the session ended as completed without any light
  // (nothing was given). A session stopped before the light is the stopped-early deviation.
  const finished =
    (startAt !== null && endAt !== null) ||
    (startAt === null && sessionOver && record.outcome === 'completed');
  if (!finished) return;
  // PDT: the exposure is judged on the figure the laser displayed, entered by the nurse at the end
  // of the light step; the taps' difference is shown beside it as information. Until it is
  // entered a running session is not judged; a session that ended without it is judged on the taps.
  const tapsS = (isPdt ? record.lightOnS : record.uvOnS) ?? 0;
  const deviceS = isPdt ? record.deviceExposureS : null;
  if (isPdt && startAt !== null && deviceS === null && !sessionOver) return;
  const what = isPdt ? 'Laser' : 'UV';
  // The light step's end, or the session's end when it ended without one.
  const lightJudgedAt = endAt ?? record.endedAt;
  const onS = deviceS ?? tapsS;
  const plannedS = (isPdt ? plan.exposureS : plan.uvTimeS) ?? protocol.light.exposureS;
  const { exposureS: exposureTolS, fluencePct } = protocol.tolerances;
  const tapsNote =
    !isPdt || startAt === null
      ? ''
      : deviceS !== null
        ? ` (the taps put it at ${lightTimeText(tapsS)})`
        : ' by the taps: no exposure was entered from the laser';
  if (outside(onS, plannedS, exposureTolS)) {
    add({
      type: 'exposure-time',
      severity: 'major',
      expected: plannedS,
      actual: round(onS, 0.001),
      unit: 's',
      at: lightJudgedAt,
      message: `${what} on-time expected ${lightTimeText(plannedS)} (± ${lightTimeText(exposureTolS)}); ${deviceS !== null ? `the laser displayed ${lightTimeText(deviceS)}` : `it was on for ${lightTimeText(onS)}`}${tapsNote}${protocol.light.pulse ? ' (on-share of the pulsed cycle)' : ''}.`,
    });
  }
  const targetJPerCm2 = plan.fluenceJPerCm2 ?? protocol.light.targetFluenceJPerCm2;
  // The irradiance the record worked the fluence from: measured (CXL), nominal from the device's
  // settings (PDT), or the plan's when the session named no device.
  const irradianceMwPerCm2 =
    record.deviceUsed?.fluenceIrradianceMwPerCm2 ??
    plan.irradianceMwPerCm2 ??
    protocol.light.irradianceMwPerCm2;
  const basis = record.deviceUsed?.fluenceBasis ?? 'planned';
  const basisText = basis === 'planned' ? '' : ` ${basis}`;
  const deliveredJPerCm2 =
    record.deliveredFluenceJPerCm2 ?? fluenceJPerCm2(irradianceMwPerCm2, onS);
  const offPct = ((deliveredJPerCm2 - targetJPerCm2) / targetJPerCm2) * 100;
  if (!withinPct(deliveredJPerCm2, targetJPerCm2, fluencePct)) {
    add({
      type: 'delivered-fluence',
      severity: 'major',
      expected: targetJPerCm2,
      actual: round(deliveredJPerCm2, 0.0001),
      unit: 'J/cm²',
      at: lightJudgedAt,
      message: `Delivered fluence expected ${formatNumber(targetJPerCm2)} J/cm² (± ${formatNumber(fluencePct)} %); ${formatNumber(round(irradianceMwPerCm2, 0.01))} mW/cm²${basisText} for ${lightTimeText(onS)} gave ${formatReading('fluenceJPerCm2', deliveredJPerCm2)}, ${formatNumber(round(Math.abs(offPct), 0.1))} % ${offPct > 0 ? 'over' : 'under'}.`,
    });
  }
}

/**
 * What was set on the device against the plan: the laser's power and spot (the spot as the
 * protocol says the laser takes it), or the UV irradiance. Judged once the session has started
 * with a device; the tolerance is the protocol's deviceChecks.settingTolerancePct, or, in
 * versions without it, its fluence tolerance (a setting that far off moves the fluence as far).
 */
function judgeDeviceSettings(
  protocol: ProtocolVersion,
  plan: DosePlan,
  record: DoseRecord,
  add: (d: Deviation) => void,
): void {
  const used = record.deviceUsed;
  if (!used?.device) return;
  const tolerancePct = protocol.deviceChecks?.settingTolerancePct ?? protocol.tolerances.fluencePct;
  const spotPlanned =
    (protocol.deviceChecks?.laserSpotSetting ?? 'device-spot') === 'device-spot'
      ? plan.deviceSpotDiameterUm
      : plan.spotDiameterUm;
  const settings: [string, number | null, number | null, string][] = [
    ['power', used.powerSetMw, plan.powerMw, 'mW'],
    ['spot', used.spotSetUm, spotPlanned, 'µm'],
    ['irradiance', used.irradianceSetMwPerCm2, plan.irradianceMwPerCm2, 'mW/cm²'],
  ];
  const off = settings.filter(
    (entry): entry is [string, number, number, string] =>
      entry[1] !== null && entry[2] !== null && !withinPct(entry[1], entry[2], tolerancePct),
  );
  const first = off[0];
  if (!first) return;
  add({
    type: 'device-setting',
    severity: 'major',
    expected: first[2],
    actual: first[1],
    unit: first[3],
    at: record.sessionStartedAt,
    message: `${used.device.name} was set off plan (± ${formatNumber(tolerancePct)} %): ${off
      .map(
        ([what, actual, expected, unit]) =>
          `${what} ${formatNumber(actual)} ${unit} set, ${formatNumber(round(expected, 0.1))} ${unit} planned`,
      )
      .join('; ')}.`,
  });
}

function judgeCxl(
  protocol: ProtocolVersion,
  cxl: NonNullable<ProtocolVersion['cxl']>,
  record: DoseRecord,
  add: (d: Deviation) => void,
): void {
  const { tolerances } = protocol;
  const soakFinished = record.soakStartAt !== null && record.soakEndAt !== null;
  const uvWithoutSoak = record.soakStartAt === null && record.uvStartAt !== null;
  if (tolerances.soakShortfallMin !== null && (soakFinished || uvWithoutSoak)) {
    const actualS = record.soakDurationS ?? 0;
    const shortestS = (cxl.soakMin - tolerances.soakShortfallMin) * 60;
    // Judged to the whole second, as the clock shows it: a tap a few ms early is not a short soak.
    if (Math.round(actualS) < shortestS) {
      add({
        type: 'soak-short',
        severity: 'major',
        expected: cxl.soakMin,
        actual: round(actualS / 60, minuteStep),
        unit: 'min',
        at: record.soakEndAt ?? record.uvStartAt,
        message: `Riboflavin soak expected ${durationText(cxl.soakMin * 60)}${tolerances.soakShortfallMin > 0 ? ` (at least ${durationText(shortestS)})` : ''}; ${uvWithoutSoak ? 'UV started with no soak recorded' : `it lasted ${durationText(actualS)}`}.`,
      });
    }
  }

  if (tolerances.dropGapPct !== null) {
    const factor = 1 + tolerances.dropGapPct / 100;
    const phases = [
      {
        name: 'the soak',
        intervalS: cxl.dropIntervalSoakMin * 60,
        gapS: record.soakEndAt !== null ? record.longestDropGapSoakS : null,
        endedAt: record.soakEndAt,
        severity: 'minor' as DeviationSeverity,
      },
      // During UV the riboflavin film is what shields the deeper cornea, so a gap there weighs more.
      {
        name: 'UV',
        intervalS: cxl.dropIntervalUvMin * 60,
        gapS: record.uvEndAt !== null ? record.longestDropGapUvS : null,
        endedAt: record.uvEndAt,
        severity: 'major' as DeviationSeverity,
      },
    ];
    const over = phases.flatMap((phase) =>
      phase.gapS !== null && exceeds(phase.gapS, phase.intervalS * factor)
        ? [{ ...phase, gapS: phase.gapS, ratio: phase.gapS / (phase.intervalS * factor) }]
        : [],
    );
    const worst = [...over].sort((a, b) => b.ratio - a.ratio)[0];
    if (worst) {
      add({
        type: 'drop-gap',
        severity: over.some((phase) => phase.severity === 'major') ? 'major' : 'minor',
        expected: worst.intervalS,
        actual: round(worst.gapS, 0.001),
        unit: 's',
        at: worst.endedAt,
        message: over
          .map(
            (phase) =>
              `During ${phase.name} a drop was expected every ${durationText(phase.intervalS)} (gap at most ${durationText(phase.intervalS * factor)}); the longest gap was ${durationText(phase.gapS)}.`,
          )
          .join(' '),
      });
    }
  }

  if (record.uvStartAt !== null) {
    const minUm = cxl.minStromalThicknessUm;
    const readingUm = record.thicknessBeforeUvUm;
    if (readingUm === null || readingUm < minUm) {
      add({
        type: 'uv-below-thickness',
        // No reading is a missing safety check rather than a known thin cornea.
        severity: readingUm === null ? 'major' : 'critical',
        expected: minUm,
        actual: readingUm,
        unit: 'µm',
        at: record.uvStartAt,
        message:
          readingUm === null
            ? `UV expected to start on a stroma measured at ${formatNumber(minUm)} µm or more; it started with no thickness reading recorded in the session.`
            : `UV expected to start on a stroma of ${formatNumber(minUm)} µm or more; it started at ${formatNumber(readingUm)} µm.`,
      });
    }
  }

  if (record.thicknessOverrideReason !== null) {
    add({
      type: 'thickness-override',
      severity: 'major',
      expected: cxl.minStromalThicknessUm,
      actual: record.thicknessBeforeUvUm,
      unit: 'µm',
      at: record.uvStartAt,
      message: `The thickness minimum of ${formatNumber(cxl.minStromalThicknessUm)} µm was overridden${record.thicknessBeforeUvUm === null ? '' : ` at ${formatNumber(record.thicknessBeforeUvUm)} µm`}. Reason: ${quoted(record.thicknessOverrideReason)}.`,
    });
  }
}

function judgeChecklist(
  protocol: ProtocolVersion,
  checklist: readonly ChecklistAnswer[],
  sessionStartedAt: string | null,
  add: (d: Deviation) => void,
): void {
  const questions = new Map(protocol.contraindications.map((item) => [item.id, item]));
  const overridden = checklist.filter((answer) => answer.answer === 'yes' && answer.overrideReason);
  if (overridden.length === 0) return;
  // An answer to a question the protocol does not hold is treated as a caution.
  const absolute = overridden.some((answer) => questions.get(answer.id)?.severity === 'absolute');
  const lines = overridden.map((answer) => {
    const question = questions.get(answer.id);
    return `"${question?.question ?? answer.id}" (${question?.severity === 'absolute' ? 'contraindication' : 'caution'}) — reason: ${quoted(answer.overrideReason ?? '')}`;
  });
  add({
    type: 'contraindication-override',
    severity: absolute ? 'critical' : 'minor',
    expected: 0,
    actual: overridden.length,
    unit: 'answers',
    // Answered at signing, before any tap: the session's start is when it was acted on.
    at: sessionStartedAt,
    message: `Expected no contraindication answered yes; ${overridden.length} answered yes and treated anyway: ${lines.join('; ')}.`,
  });
}
