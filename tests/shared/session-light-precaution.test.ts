import { describe, expect, it } from 'vitest';
import { lightPrecautionEnd } from '../../shared/session/light-precaution';

// 48 h is the demo protocol's period: sources differ between 48 hours and 5 days (both from
// memory, DOMAIN.md); the site sets it. Lisbon's clock changes follow the tz database (WEST,
// UTC+1, until the last Sunday of October at 01:00 UTC; WET, UTC+0, until the last Sunday of March).

describe('the end of the light precaution after verteporfin', () => {
  it('counts 48 real hours across the autumn change in Lisbon: 10:00 on Saturday ends at 09:00 local on Monday', () => {
    const end = lightPrecautionEnd({
      infusionStartAt: '2026-10-24T10:00:00+01:00',
      hours: 48,
      zone: 'Europe/Lisbon',
    });

    expect(end).toEqual({
      endUtc: '2026-10-26T09:00:00.000Z',
      endLocal: '2026-10-26T09:00:00.000+00:00',
      endLocalText: 'Monday 26 October 2026, 09:00 WET',
    });
  });

  it('counts 48 real hours across the spring change in Lisbon: 10:00 on Saturday ends at 11:00 local on Monday', () => {
    const end = lightPrecautionEnd({
      infusionStartAt: '2027-03-27T10:00:00+00:00',
      hours: 48,
      zone: 'Europe/Lisbon',
    });

    expect(end).toEqual({
      endUtc: '2027-03-29T10:00:00.000Z',
      endLocal: '2027-03-29T11:00:00.000+01:00',
      endLocalText: 'Monday 29 March 2027, 11:00 WEST',
    });
  });

  it('gives the same end whatever offset the infusion start was written with', () => {
    const fromUtc = lightPrecautionEnd({
      infusionStartAt: '2026-10-24T09:00:00Z',
      hours: 48,
      zone: 'Europe/Lisbon',
    });
    const fromLocal = lightPrecautionEnd({
      infusionStartAt: '2026-10-24T10:00:00+01:00',
      hours: 48,
      zone: 'Europe/Lisbon',
    });

    expect(fromUtc).toEqual(fromLocal);
  });

  it('keeps the local clock time when no change falls inside the period, here 5 days', () => {
    const end = lightPrecautionEnd({
      infusionStartAt: '2026-11-23T09:30:00Z',
      hours: 120,
      zone: 'Europe/Lisbon',
    });

    expect(end.endLocal).toBe('2026-11-28T09:30:00.000+00:00');
  });

  it('names an American zone by its usual English abbreviation', () => {
    const end = lightPrecautionEnd({
      infusionStartAt: '2026-07-01T14:00:00Z',
      hours: 48,
      zone: 'America/New_York',
    });

    expect(end.endLocalText).toBe('Friday 3 July 2026, 10:00 EDT');
  });

  it('refuses an unknown time zone and an unreadable start, naming the field', () => {
    expect(() =>
      lightPrecautionEnd({
        infusionStartAt: '2026-07-01T14:00:00Z',
        hours: 48,
        zone: 'Europe/Atlantis',
      }),
    ).toThrow(/zone must be an IANA time zone/);
    expect(() =>
      lightPrecautionEnd({ infusionStartAt: 'yesterday', hours: 48, zone: 'Europe/Lisbon' }),
    ).toThrow(/infusionStartAt/);
  });
});
