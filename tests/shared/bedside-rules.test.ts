import { describe, expect, it } from 'vitest';
import { lateTapVerdict } from '../../shared/orders/lifecycle';
import type { ProtocolVersion } from '../../shared/protocol/protocol-schema';
import type { SessionEventLike } from '../../shared/session/dose-record';
import {
  identityConfirmationMissing,
  lateEntryPlaceVerdict,
  shortEndVerdict,
} from '../../shared/session/session-rules';

// Demo tolerances of the fictitious unit (site policy, common practice): soak without shortfall,
// infusion ± 1 min, light ± 2 s.
const tolerances = {
  exposureS: 2,
  fluencePct: 5,
  infusionDurationMin: 1,
  lightStartMin: 1,
  drugVolumePct: 2,
  reconstitutionToInfusionMaxH: 4,
  doseCheck: null,
  soakShortfallMin: 0,
  dropGapPct: 50,
} as ProtocolVersion['tolerances'];

describe('ending a timed dose step short', () => {
  it('a 30 min soak ended at 4 min is short; at 30 min it is not (Wollensak G et al., Am J Ophthalmol 2003)', () => {
    const soak = { kind: 'soak' as const, durationS: 1800 };
    expect(shortEndVerdict(soak, tolerances, 240)).toEqual({
      short: true,
      shortestS: 1800,
      durationS: 1800,
    });
    expect(shortEndVerdict(soak, tolerances, 1799.6)).toEqual({ short: false });
  });

  it('a 10 min infusion may end a minute early, the 83 s light 2 s early (TAP Study Group, Arch Ophthalmol 1999; tolerances common practice)', () => {
    const infusion = { kind: 'infusion' as const, durationS: 600 };
    expect(shortEndVerdict(infusion, tolerances, 540)).toEqual({ short: false });
    expect(shortEndVerdict(infusion, tolerances, 530).short).toBe(true);
    const light = { kind: 'light' as const, durationS: 83 };
    expect(shortEndVerdict(light, tolerances, 81).short).toBe(false);
    expect(shortEndVerdict(light, tolerances, 70).short).toBe(true);
  });

  it('an untimed step or one that gives no dose is never short', () => {
    expect(shortEndVerdict({ kind: 'thickness', durationS: null }, tolerances, 1).short).toBe(
      false,
    );
    expect(shortEndVerdict({ kind: 'wait', durationS: 300 }, tolerances, 1).short).toBe(false);
  });
});

describe('identity and eye again before the light', () => {
  const at = (iso: string) => Date.parse(iso);
  const confirmation = (stepId: string, clientTime: string) =>
    ({
      type: 'identity-confirmed',
      stepId,
      checks: { patientName: true, dateOfBirth: true, treatmentEye: true },
      idempotencyKey: '00000000-0000-4000-8000-000000000001',
      clientTime,
    }) as SessionEventLike;

  it('is missing for a light step without a confirmation of that step at or before the start', () => {
    const laser = { id: 'laser', kind: 'light' as const };
    const start = at('2026-12-03T10:15:00Z');
    expect(identityConfirmationMissing(laser, start, [])).toBe(true);
    expect(
      identityConfirmationMissing(laser, start, [confirmation('laser', '2026-12-03T10:16:00Z')]),
    ).toBe(true);
    expect(
      identityConfirmationMissing(laser, start, [confirmation('uv', '2026-12-03T10:14:00Z')]),
    ).toBe(true);
    expect(
      identityConfirmationMissing(laser, start, [confirmation('laser', '2026-12-03T10:14:00Z')]),
    ).toBe(false);
  });

  it('is never asked for a step that is not light or UV', () => {
    expect(identityConfirmationMissing({ id: 'infusion', kind: 'infusion' }, 0, [])).toBe(false);
  });
});

describe('where a missed tap entered late may fall', () => {
  const runs = [{ startMs: 1000, endMs: 5000, pauses: [] }];
  it('a drop inside a run of its step, not before its start or after its end', () => {
    expect(
      lateEntryPlaceVerdict({ type: 'drop-given', atMs: 3000 }, { runs, lastBoundaryMs: 5000 })
        .allowed,
    ).toBe(true);
    expect(
      lateEntryPlaceVerdict({ type: 'drop-given', atMs: 500 }, { runs, lastBoundaryMs: 5000 })
        .allowed,
    ).toBe(false);
    expect(
      lateEntryPlaceVerdict({ type: 'drop-given', atMs: 6000 }, { runs, lastBoundaryMs: 5000 })
        .allowed,
    ).toBe(false);
  });

  it('an end only of a running step, after its start; a start only after every step boundary on record', () => {
    const open = [{ startMs: 1000, endMs: null, pauses: [] }];
    expect(
      lateEntryPlaceVerdict(
        { type: 'step-ended', atMs: 2000 },
        { runs: open, lastBoundaryMs: 1000 },
      ).allowed,
    ).toBe(true);
    expect(
      lateEntryPlaceVerdict({ type: 'step-ended', atMs: 900 }, { runs: open, lastBoundaryMs: 1000 })
        .allowed,
    ).toBe(false);
    expect(
      lateEntryPlaceVerdict({ type: 'step-ended', atMs: 6000 }, { runs, lastBoundaryMs: 5000 })
        .allowed,
    ).toBe(false);
    expect(
      lateEntryPlaceVerdict(
        { type: 'step-started', atMs: 6000 },
        { runs: [], lastBoundaryMs: 5000 },
      ).allowed,
    ).toBe(true);
    expect(
      lateEntryPlaceVerdict(
        { type: 'step-started', atMs: 4000 },
        { runs: [], lastBoundaryMs: 5000 },
      ).allowed,
    ).toBe(false);
  });

  it('while the session runs, a late entry is taken only for a missed step start or end, drop or reading', () => {
    const facts = { tapMs: 1000, endedMs: null, lateEntry: true, endsOrWithdraws: false };
    expect(lateTapVerdict('in-session', { ...facts, lateKind: true })).toEqual({ take: true });
    expect(lateTapVerdict('in-session', { ...facts, lateKind: false })).toMatchObject({
      take: false,
      field: 'lateEntryReason',
    });
  });
});
