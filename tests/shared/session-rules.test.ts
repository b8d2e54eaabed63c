import { describe, expect, it } from 'vitest';
import {
  drugTimeVerdict,
  exposureMissing,
  uvStartVerdict,
  volumeInfusedRequired,
} from '../../shared/session/session-rules';

describe('the session rules both sides read', () => {
  it('UV starts at or above the minimum, or with an authorised override', () => {
    // 400 µm minimum stromal thickness before UV (Spoerl E et al. Cornea 2007).
    expect(uvStartVerdict(400, 400, false)).toEqual({ allowed: true });
    expect(uvStartVerdict(400, 399, false)).toEqual({
      allowed: false,
      lastReadingUm: 399,
      minimumUm: 400,
    });
    expect(uvStartVerdict(400, null, false)).toEqual({
      allowed: false,
      lastReadingUm: null,
      minimumUm: 400,
    });
    expect(uvStartVerdict(400, 380, true)).toEqual({ allowed: true });
  });

  it('no session or infusion from a drug past its beyond-use time, no infusion before it was made up', () => {
    // 4 h beyond-use after reconstitution (review table, Drug Discov Today 2008).
    const preparation = {
      reconstitutedAt: '2026-12-03T08:00:00.000Z',
      beyondUseAt: '2026-12-03T12:00:00.000Z',
    };
    expect(drugTimeVerdict('session', Date.parse('2026-12-03T12:00:00.000Z'), preparation)).toEqual(
      { allowed: true },
    );
    expect(drugTimeVerdict('session', Date.parse('2026-12-03T12:00:00.001Z'), preparation)).toEqual(
      { allowed: false, rule: 'beyond_use' },
    );
    expect(
      drugTimeVerdict('infusion', Date.parse('2026-12-03T07:59:59.999Z'), preparation),
    ).toEqual({ allowed: false, rule: 'before_reconstitution' });
    expect(drugTimeVerdict('session', Date.parse('2026-12-03T07:00:00.000Z'), preparation)).toEqual(
      { allowed: true },
    );
    expect(drugTimeVerdict('infusion', Date.parse('2026-12-03T09:00:00.000Z'), null)).toEqual({
      allowed: true,
    });
  });

  it('the volume infused is due at an extravasation, and at a stop once the infusion started', () => {
    expect(
      volumeInfusedRequired('extravasation', { infusionStarted: false, volumeKnown: true }),
    ).toBe(true);
    expect(
      volumeInfusedRequired('session-stopped', { infusionStarted: true, volumeKnown: false }),
    ).toBe(true);
    expect(
      volumeInfusedRequired('session-stopped', { infusionStarted: true, volumeKnown: true }),
    ).toBe(false);
    expect(
      volumeInfusedRequired('session-stopped', { infusionStarted: false, volumeKnown: false }),
    ).toBe(false);
  });

  it('the laser’s exposure is due once the light has run', () => {
    expect(
      exposureMissing({ lightStarted: true, lightRunning: false, exposureEntered: false }),
    ).toBe(true);
    expect(
      exposureMissing({ lightStarted: true, lightRunning: true, exposureEntered: false }),
    ).toBe(false);
    expect(
      exposureMissing({ lightStarted: true, lightRunning: false, exposureEntered: true }),
    ).toBe(false);
    expect(
      exposureMissing({ lightStarted: false, lightRunning: false, exposureEntered: false }),
    ).toBe(false);
  });
});
