import { describe, expect, it } from 'vitest';
import { doseInInfusedVolumeMg } from '../../shared/engine/dose-given';
import { canReprepare, lateTapVerdict } from '../../shared/orders/lifecycle';
import { precautionStartFor } from '../../shared/session/light-precaution';

describe('the milligrams in the volume infused', () => {
  it('is the share of the final volume: 12 of 30 mL carry 12/30 of 10.92 mg', () => {
    // 6 mg/m² × 1.82 m² = 10.92 mg in 30 mL (TAP Study Group, Arch Ophthalmol 1999; Mosteller 1987).
    expect(doseInInfusedVolumeMg(12, 10.92, 30)).toBeCloseTo(4.368, 12);
    expect(doseInInfusedVolumeMg(30, 10.92, 30)).toBe(10.92);
    expect(doseInInfusedVolumeMg(0, 10.92, 30)).toBe(0);
  });

  it('refuses a volume above the final volume or below zero, naming it', () => {
    expect(() => doseInInfusedVolumeMg(30.1, 10.92, 30)).toThrow(
      /volumeInfusedMl must be a number from 0 to 30 mL/,
    );
    expect(() => doseInInfusedVolumeMg(-1, 10.92, 30)).toThrow(/volumeInfusedMl/);
    expect(() => doseInInfusedVolumeMg(1, 10.92, 0)).toThrow(/finalVolumeMl/);
  });
});

describe('taps reaching an ended session', () => {
  const endedMs = Date.parse('2026-12-03T10:00:00Z');
  it('takes a queued tap made before the end, and one after it only as a late entry that neither ends nor withdraws', () => {
    expect(
      lateTapVerdict('completed', {
        tapMs: endedMs - 1000,
        endedMs,
        lateEntry: false,
        endsOrWithdraws: false,
      }),
    ).toEqual({ take: true });
    expect(
      lateTapVerdict('reviewed', {
        tapMs: endedMs + 1000,
        endedMs,
        lateEntry: false,
        endsOrWithdraws: false,
      }),
    ).toMatchObject({ take: false, field: 'lateEntryReason' });
    expect(
      lateTapVerdict('stopped', {
        tapMs: endedMs + 1000,
        endedMs,
        lateEntry: true,
        endsOrWithdraws: false,
      }),
    ).toEqual({ take: true });
    expect(
      lateTapVerdict('stopped', {
        tapMs: endedMs + 1000,
        endedMs,
        lateEntry: true,
        endsOrWithdraws: true,
      }),
    ).toMatchObject({ take: false });
    expect(
      lateTapVerdict('in-session', {
        tapMs: endedMs,
        endedMs: null,
        lateEntry: true,
        endsOrWithdraws: false,
      }),
    ).toMatchObject({ take: false });
  });
});

describe('making a drug up again', () => {
  it('is allowed only past the beyond-use time, before any infusion, while prepared or in session', () => {
    expect(canReprepare('prepared', { beyondUsePassed: true, infusionStarted: false })).toEqual({
      allowed: true,
    });
    expect(canReprepare('in-session', { beyondUsePassed: true, infusionStarted: false })).toEqual({
      allowed: true,
    });
    expect(
      canReprepare('in-session', { beyondUsePassed: true, infusionStarted: true }).allowed,
    ).toBe(false);
    expect(
      canReprepare('prepared', { beyondUsePassed: false, infusionStarted: false }).allowed,
    ).toBe(false);
    expect(
      canReprepare('completed', { beyondUsePassed: true, infusionStarted: false }).allowed,
    ).toBe(false);
  });
});

describe('where the light precaution counts from', () => {
  it('is the infusion start when recorded, otherwise the latest plausible time with a note', () => {
    expect(
      precautionStartFor(
        { infusionStartAt: '2026-12-03T09:01:00.000Z', endedAt: '2026-12-03T09:30:00.000Z' },
        '2026-12-03T10:00:00.000Z',
      ),
    ).toEqual({ at: '2026-12-03T09:01:00.000Z', basis: 'infusion-start', note: null });
    const late = precautionStartFor(
      { infusionStartAt: null, endedAt: '2026-12-03T09:30:00.000Z' },
      '2026-12-03T10:00:00.000Z',
    );
    expect(late).toMatchObject({ at: '2026-12-03T09:30:00.000Z', basis: 'latest-plausible' });
    expect(late.note).toMatch(/No infusion start is on record/);
    expect(
      precautionStartFor({ infusionStartAt: null, endedAt: null }, '2026-12-03T10:00:00.000Z').at,
    ).toBe('2026-12-03T10:00:00.000Z');
  });
});
