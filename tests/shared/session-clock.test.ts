import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { computePlan } from '../../shared/engine/compute-plan';
import { sessionClock } from '../../shared/session/session-clock';
import {
  sessionEventSchema,
  type SessionEvent,
  type SessionEventInput,
} from '../../shared/session/session-events';
import { loadProtocol } from './support/shipped-protocols';

type EventBody = SessionEventInput extends infer E
  ? E extends unknown
    ? Omit<E, 'idempotencyKey' | 'clientTime'>
    : never
  : never;

const t0Ms = Date.parse('2026-11-23T09:00:00.000Z');
const allChecks = {
  patientIdentity: true,
  treatmentEye: true,
  consent: true,
  eyewear: true,
  deviceSettings: true,
} as const;
const atIso = (s: number) => new Date(t0Ms + Math.round(s * 1000)).toISOString();
const at = (s: number) => t0Ms + Math.round(s * 1000);

/** Events in tapping order; each at `s` seconds after t0, validated by the event contract. */
class Taps {
  readonly events: SessionEvent[] = [];
  tap(s: number, body: EventBody): this {
    const id = this.events.length + 1;
    const input = sessionEventSchema.parse({
      ...body,
      idempotencyKey: `00000000-0000-4000-8000-${String(id).padStart(12, '0')}`,
      clientTime: atIso(s),
    });
    this.events.push({ ...input, id, serverTime: atIso(s), recordedBy: 1 });
    return this;
  }
  step(stepId: string, fromS: number, toS: number | null): this {
    this.tap(fromS, { type: 'step-started', stepId });
    return toS === null ? this : this.tap(toS, { type: 'step-ended', stepId });
  }
}

const pdt = loadProtocol('pdt-standard');
const pdtPlan = computePlan(pdt, {
  height: { value: 170, unit: 'cm' },
  weight: { value: 70, unit: 'kg' },
  lesionGldUm: 2000,
  lensMagnification: 1,
});
const cxl = loadProtocol('cxl-standard');
const cxlPlan = computePlan(cxl, { stromalThicknessUm: 450 });
const pulsed = loadProtocol('cxl-accelerated-pulsed');
const pulsedPlan = computePlan(pulsed, { stromalThicknessUm: 450 });

/** PDT: infusion from 0 s, so the light is due 900 s later (TAP Study Group, Arch Ophthalmol 1999). */
const pdtUpToInfusion = () =>
  new Taps()
    .tap(-60, { type: 'session-started', checks: allChecks })
    .step('confirm-patient', -60, 0)
    .step('infusion', 0, null);

describe('the bedside step clock', () => {
  it('shows the first step as next before anything is tapped', () => {
    const clock = sessionClock({ protocol: pdt, plan: pdtPlan, events: [], nowMs: at(0) });

    expect(clock).toMatchObject({
      phase: 'not-started',
      current: null,
      next: { index: 0, id: 'confirm-patient' },
      lightStartInS: null,
      infusedVolumeMl: null,
      upcomingChangeInS: null,
    });
  });

  it('7 min into the infusion: 21 mL infused at 3 mL/min, 3 min of infusion left, light due in 8 min', () => {
    // 30 mL over 10 min = 3 mL/min; light 15 min after the infusion START (TAP Study Group, Arch Ophthalmol 1999).
    const clock = sessionClock({
      protocol: pdt,
      plan: pdtPlan,
      events: pdtUpToInfusion().events,
      nowMs: at(420),
    });

    expect(clock.phase).toBe('running');
    expect(clock.current).toMatchObject({
      index: 1,
      id: 'infusion',
      kind: 'infusion',
      startedAt: atIso(0),
      durationS: 600,
      elapsedS: 420,
      remainingS: 180,
      overrunS: 0,
      paused: false,
    });
    expect(clock.infusedVolumeMl).toBe(21);
    expect(clock.lightStartInS).toBe(480);
    expect(clock.next).toMatchObject({ id: 'wait-for-light' });
    expect(clock.nextCueInS).toBe(60);
    expect(clock.upcomingChangeInS).toBe(60);
  });

  it('counts the light start from the infusion START, negative once it is late, and shows the overrun of the wait', () => {
    // TAP Study Group, Arch Ophthalmol 1999: light 15 min after the start of the infusion.
    const taps = pdtUpToInfusion()
      .tap(600, { type: 'step-ended', stepId: 'infusion' })
      .step('wait-for-light', 600, null);

    const clock = sessionClock({
      protocol: pdt,
      plan: pdtPlan,
      events: taps.events,
      nowMs: at(960),
    });

    expect(clock.lightStartInS).toBe(-60);
    expect(clock.infusedVolumeMl).toBe(30);
    expect(clock.current).toMatchObject({
      id: 'wait-for-light',
      elapsedS: 360,
      remainingS: 0,
      overrunS: 60,
    });
  });

  it('30 s into the laser step with a 10 s pause: 20 s of light given, 63 s left', () => {
    // 83 s of light: TAP Study Group, Arch Ophthalmol 1999.
    const taps = pdtUpToInfusion()
      .tap(600, { type: 'step-ended', stepId: 'infusion' })
      .step('wait-for-light', 600, 900)
      .step('laser', 900, null)
      .tap(910, { type: 'paused', stepId: 'laser' })
      .tap(920, { type: 'resumed', stepId: 'laser' });

    const clock = sessionClock({
      protocol: pdt,
      plan: pdtPlan,
      events: taps.events,
      nowMs: at(930),
    });

    expect(clock.current).toMatchObject({
      id: 'laser',
      elapsedS: 20,
      remainingS: 63,
      overrunS: 0,
      paused: false,
    });
    expect(clock.lightStartInS).toBeNull();
    expect(clock.nextCueInS).toBeNull();
    expect(clock.upcomingChangeInS).toBe(63);
    expect(clock.next).toMatchObject({ id: 'aftercare' });
  });

  it('stops the laser countdown during a pause', () => {
    const taps = pdtUpToInfusion()
      .step('laser', 900, null)
      .tap(910, { type: 'paused', stepId: 'laser' });

    const early = sessionClock({
      protocol: pdt,
      plan: pdtPlan,
      events: taps.events,
      nowMs: at(915),
    });
    const later = sessionClock({
      protocol: pdt,
      plan: pdtPlan,
      events: taps.events,
      nowMs: at(990),
    });

    expect(early.current).toMatchObject({ elapsedS: 10, remainingS: 73, paused: true });
    expect(later.current).toMatchObject({ elapsedS: 10, remainingS: 73, paused: true });
    expect(later.upcomingChangeInS).toBeNull();
  });

  it('offers the swelling step next only when the last thickness reading is below 400 µm', () => {
    // Minimum 400 µm before UV: Spoerl E et al. Cornea 2007; swelling of thin corneas: Hafezi F et al. J Cataract Refract Surg 2009 (from memory).
    const reading = (thicknessUm: number) =>
      new Taps()
        .tap(0, { type: 'session-started', checks: allChecks })
        .step('thickness-check', 0, null)
        .tap(20, { type: 'thickness-measured', stepId: 'thickness-check', thicknessUm })
        .tap(30, { type: 'step-ended', stepId: 'thickness-check' });

    const thick = sessionClock({
      protocol: cxl,
      plan: cxlPlan,
      events: reading(400).events,
      nowMs: at(40),
    });
    const thin = sessionClock({
      protocol: cxl,
      plan: cxlPlan,
      events: reading(380).events,
      nowMs: at(40),
    });

    expect(thick.current).toBeNull();
    expect(thick.next).toMatchObject({ id: 'uv-exposure' });
    expect(thin.next).toMatchObject({ id: 'stromal-swelling' });
  });

  it('cues the next drop from the last drop given, not from the start of the soak', () => {
    // Drops every 2 min during the soak (from memory / common practice).
    const soak = new Taps()
      .tap(0, { type: 'session-started', checks: allChecks })
      .step('riboflavin-soak', 0, null);
    const noDrop = sessionClock({
      protocol: cxl,
      plan: cxlPlan,
      events: soak.events,
      nowMs: at(150),
    });
    soak.tap(100, { type: 'drop-given', stepId: 'riboflavin-soak' });
    const afterDrop = sessionClock({
      protocol: cxl,
      plan: cxlPlan,
      events: soak.events,
      nowMs: at(150),
    });

    expect(noDrop.nextCueInS).toBe(90);
    expect(afterDrop.nextCueInS).toBe(70);
    expect(afterDrop.upcomingChangeInS).toBe(70);
  });

  it('shows which half of a 1 s on / 1 s off UV cycle the light is in, and switches it off during a pause', () => {
    // Pulsed 30 mW/cm², 1:1 on/off: porcine cornea study, PMC5321166 (published abstract); the 1 s period is the demo file's choice.
    const uv = new Taps()
      .tap(0, { type: 'session-started', checks: allChecks })
      .step('uv-exposure', 0, null);

    const on = sessionClock({
      protocol: pulsed,
      plan: pulsedPlan,
      events: uv.events,
      nowMs: at(10.4),
    });
    const off = sessionClock({
      protocol: pulsed,
      plan: pulsedPlan,
      events: uv.events,
      nowMs: at(11.5),
    });
    uv.tap(12.2, { type: 'paused', stepId: 'uv-exposure' });
    const paused = sessionClock({
      protocol: pulsed,
      plan: pulsedPlan,
      events: uv.events,
      nowMs: at(13),
    });

    expect(on.pulse?.lightOn).toBe(true);
    expect(on.pulse?.phaseLeftS).toBeCloseTo(0.6, 9);
    expect(off.pulse?.lightOn).toBe(false);
    expect(off.pulse?.phaseLeftS).toBeCloseTo(0.5, 9);
    expect(paused.pulse).toEqual({ lightOn: false, phaseLeftS: null });
    expect(paused.current).toMatchObject({ elapsedS: 12.2, remainingS: 467.8, paused: true });
  });

  it('shows finished after the session is completed and stopped after it is stopped, with no step running', () => {
    const base = () =>
      pdtUpToInfusion()
        .tap(600, { type: 'step-ended', stepId: 'infusion' })
        .step('laser', 900, null);

    const finished = sessionClock({
      protocol: pdt,
      plan: pdtPlan,
      events: base().tap(983, { type: 'session-completed' }).events,
      nowMs: at(1000),
    });
    const stopped = sessionClock({
      protocol: pdt,
      plan: pdtPlan,
      events: base().tap(950, {
        type: 'session-stopped',
        reason: 'laser fault reported by the device',
      }).events,
      nowMs: at(1000),
    });

    expect(finished).toMatchObject({
      phase: 'finished',
      current: null,
      next: null,
      lightStartInS: null,
      upcomingChangeInS: null,
    });
    expect(stopped).toMatchObject({ phase: 'stopped', current: null, next: null });
  });

  it('shows the same thing after a reload, whatever order the events arrive in', () => {
    const taps = pdtUpToInfusion()
      .tap(600, { type: 'step-ended', stepId: 'infusion' })
      .step('wait-for-light', 600, null);
    const expected = sessionClock({
      protocol: pdt,
      plan: pdtPlan,
      events: taps.events,
      nowMs: at(700),
    });

    expect(
      sessionClock({
        protocol: pdt,
        plan: pdtPlan,
        events: [...taps.events].reverse(),
        nowMs: at(700),
      }),
    ).toEqual(expected);
  });

  it('keeps elapsed + remaining = duration in every timed step until it overruns, whatever the pauses', () => {
    const timed = [
      { protocol: pdt, plan: pdtPlan },
      { protocol: cxl, plan: cxlPlan },
      { protocol: pulsed, plan: pulsedPlan },
    ].flatMap(({ protocol, plan }) =>
      protocol.steps
        .filter((step) => step.durationS !== null)
        .map((step) => ({ protocol, plan, step })),
    );
    const pauses = fc.array(
      fc.tuple(fc.integer({ min: 0, max: 600_000 }), fc.integer({ min: 1, max: 60_000 })),
      { maxLength: 5 },
    );

    fc.assert(
      fc.property(
        fc.constantFrom(...timed),
        pauses,
        fc.double({ min: 0, max: 1, noNaN: true }),
        ({ protocol, plan, step }, pauseList, fraction) => {
          const taps = new Taps()
            .tap(0, { type: 'session-started', checks: allChecks })
            .step(step.id, 0, null);
          let wallMs = 0;
          for (const [runMs, pauseMs] of pauseList) {
            wallMs += runMs;
            taps.tap(wallMs / 1000, { type: 'paused', stepId: step.id });
            wallMs += pauseMs;
            taps.tap(wallMs / 1000, { type: 'resumed', stepId: step.id });
          }
          // Now: any instant up to the step's duration of running time after the last tap.
          const nowMs = t0Ms + wallMs + Math.floor(fraction * (step.durationS ?? 0) * 1000);

          const current = sessionClock({ protocol, plan, events: taps.events, nowMs }).current;

          expect(current?.id).toBe(step.id);
          if (current && current.overrunS === 0)
            expect(current.elapsedS + (current.remainingS ?? Number.NaN)).toBeCloseTo(
              step.durationS ?? Number.NaN,
              9,
            );
          else expect(current?.remainingS).toBe(0);
        },
      ),
      { numRuns: 200 },
    );
  });
});
