import { describe, expect, it } from 'vitest';
import {
  eyeOutcome,
  summariseOutcomes,
  type VisitFacts,
} from '../../shared/engine/follow-up-outcome';
import { wilsonInterval } from '../../shared/engine/proportions';

const pdtOutcome = {
  measure: 'subretinal-fluid-resolved' as const,
  label: 'Subretinal fluid resolved at 3 months',
  visitId: 'month-3',
  baselineVisitId: null,
  maxIncreaseD: null,
};
const cxlOutcome = {
  measure: 'kmax-increase-below' as const,
  label: 'Kmax increase under 1 D at 12 months',
  visitId: 'month-12',
  baselineVisitId: 'baseline',
  // Progression = Kmax increase of 1 D or more at 12 months (common practice).
  maxIncreaseD: 1,
};

const visit = (visitKey: string, dueOn: string, facts: Partial<VisitFacts> = {}): VisitFacts => ({
  visitKey,
  recorded: true,
  dueOn,
  windowDays: 14,
  acuityLogMar: null,
  subretinalFluid: null,
  kmaxD: null,
  ...facts,
});

describe('one eye’s outcome under the protocol’s definition', () => {
  it('counts fluid resolved at the 3-month visit as reached, with the acuity change from baseline', () => {
    const result = eyeOutcome(
      pdtOutcome,
      [
        visit('baseline', '2026-01-05', { acuityLogMar: 0.6, subretinalFluid: 'present' }),
        visit('month-3', '2026-04-06', { acuityLogMar: 0.3, subretinalFluid: 'resolved' }),
      ],
      '2026-05-01',
    );
    // 0.30 − 0.60 = −0.30 logMAR (better), arithmetic of the definition.
    expect(result).toEqual({ outcome: 'reached', acuityChangeLogMar: -0.3, kmaxChangeD: null });
  });

  it('calls an unrecorded outcome visit pending inside its window and lost to follow-up after it', () => {
    const visits = [
      visit('baseline', '2026-01-05'),
      visit('month-3', '2026-04-06', { recorded: false }),
    ];
    // Window 14 days (protocol file, common practice): pending up to 2026-04-20, lost after.
    expect(eyeOutcome(pdtOutcome, visits, '2026-04-20').outcome).toBe('pending');
    expect(eyeOutcome(pdtOutcome, visits, '2026-04-21').outcome).toBe('lost-to-follow-up');
  });

  it('takes a Kmax rise under 1 D at 12 months as progression stopped, and 1 D or more as not', () => {
    // Increase < 1 D at 12 months = stopped (common practice).
    const at = (kmaxD: number) =>
      eyeOutcome(
        cxlOutcome,
        [
          visit('baseline', '2026-01-05', { kmaxD: 54.2 }),
          visit('month-12', '2027-01-05', { kmaxD }),
        ],
        '2027-02-01',
      );
    expect(at(55.1)).toMatchObject({ outcome: 'reached', kmaxChangeD: 0.9 });
    expect(at(55.2)).toMatchObject({ outcome: 'not-reached', kmaxChangeD: 1 });
    expect(at(53.0)).toMatchObject({ outcome: 'reached', kmaxChangeD: -1.2 });
  });

  it('cannot judge a cornea without a baseline Kmax', () => {
    const result = eyeOutcome(
      cxlOutcome,
      [
        visit('baseline', '2026-01-05', { recorded: false }),
        visit('month-12', '2027-01-05', { kmaxD: 52 }),
      ],
      '2027-02-01',
    );
    expect(result.outcome).toBe('not-assessable');
  });
});

describe('the summary the auditor reads', () => {
  it('shares reached among eyes assessed, shows the lost apart and the worst case beside it', () => {
    const eyes = [
      ...Array.from({ length: 8 }, () => ({
        outcome: 'reached' as const,
        acuityChangeLogMar: -0.1,
        complications: 0,
      })),
      ...Array.from({ length: 2 }, () => ({
        outcome: 'not-reached' as const,
        acuityChangeLogMar: 0.1,
        complications: 1,
      })),
      { outcome: 'lost-to-follow-up' as const, acuityChangeLogMar: null, complications: 0 },
      { outcome: 'pending' as const, acuityChangeLogMar: null, complications: 0 },
    ];
    const summary = summariseOutcomes(eyes);
    expect(summary).toMatchObject({
      treatedEyes: 12,
      reached: 8,
      notReached: 2,
      lostToFollowUp: 1,
      pending: 1,
      acuityPairs: 10,
      eyesWithComplication: 2,
    });
    // 8 of 10 → 0.490–0.943 (Wilson EB, J Am Stat Assoc 1927, from memory; the check value).
    expect(summary.share.lower).toBeCloseTo(0.4902, 4);
    expect(summary.share.upper).toBeCloseTo(0.9433, 4);
    expect(summary.shareIfLostFailed).toEqual(wilsonInterval(8, 11));
    // Mean (8 × −0.1 + 2 × 0.1) ÷ 10 = −0.06 logMAR = +3 letters (Gregori NZ et al., Retina 2010).
    expect(summary.meanAcuityChangeLogMar).toBeCloseTo(-0.06, 10);
    expect(summary.meanAcuityChangeLetters).toBe(3);
    expect(summary.complicationRate).toEqual(wilsonInterval(2, 12));
  });
});
