import { describe, expect, it } from 'vitest';
import { pChart, pChartSignalWords, wilsonInterval } from '../../shared/engine/proportions';

describe('the Wilson score 95 % interval', () => {
  it('gives 8 of 10 as 0.490 to 0.943', () => {
    // Worked example: 8/10 → 0.490–0.943 (Wilson EB, J Am Stat Assoc 1927, citation from memory;
    // the same figures in Newcombe RG, Stat Med 1998, from memory).
    const interval = wilsonInterval(8, 10);
    expect(interval.share).toBe(0.8);
    expect(interval.lower).toBeCloseTo(0.4902, 4);
    expect(interval.upper).toBeCloseTo(0.9433, 4);
  });

  it('keeps a width at 0 and at n successes, inside 0 to 1', () => {
    // 0 of 10 → 0 to 0.278 (Wilson EB, J Am Stat Assoc 1927, from memory; arithmetic of the formula).
    const none = wilsonInterval(0, 10);
    expect(none.lower).toBe(0);
    expect(none.upper).toBeCloseTo(0.2775, 4);
    const all = wilsonInterval(10, 10);
    expect(all.upper).toBe(1);
    expect(all.lower).toBeCloseTo(0.7225, 4);
  });

  it('has no share and no interval for no cases, and refuses impossible counts', () => {
    expect(wilsonInterval(0, 0)).toEqual({
      count: 0,
      total: 0,
      share: null,
      lower: null,
      upper: null,
    });
    expect(() => wilsonInterval(11, 10)).toThrow('count cannot exceed total');
    expect(() => wilsonInterval(-1, 10)).toThrow('at least 0');
  });
});

describe('the p-chart with 3-sigma limits from each month’s own count', () => {
  it('gives p̄ = 0.2 with n = 25 the limits 0 to 0.44', () => {
    // p̄ ± 3√(p̄(1−p̄)/n) = 0.2 ± 0.24, lower held at 0 (Benneyan JC, Lloyd RC, Plsek PE,
    // Qual Saf Health Care 2003).
    const chart = pChart([
      { label: '2026-01', count: 5, total: 25 },
      { label: '2026-02', count: 5, total: 25 },
    ]);
    expect(chart.centre).toBeCloseTo(0.2, 12);
    expect(chart.points[0]!.lowerLimit).toBe(0);
    expect(chart.points[0]!.upperLimit).toBeCloseTo(0.44, 12);
    expect(chart.points.every((p) => p.signal === null)).toBe(true);
  });

  it('narrows the limits for a busy month and marks a month above its limit as special cause', () => {
    // p̄ = 30/150 = 0.2; n = 100 → 0.2 ± 0.12 = 0.08 to 0.32 (Benneyan JC et al., Qual Saf Health Care 2003).
    const chart = pChart([
      { label: '2026-03', count: 20, total: 100 },
      { label: '2026-04', count: 10, total: 25 },
      { label: '2026-05', count: 0, total: 25 },
    ]);
    expect(chart.centre).toBeCloseTo(0.2, 12);
    const [busy, high, none] = chart.points;
    expect(busy!.lowerLimit).toBeCloseTo(0.08, 12);
    expect(busy!.upperLimit).toBeCloseTo(0.32, 12);
    expect(busy!.signal).toBeNull();
    // 10/25 = 0.40 sits inside 0.44; no signal yet.
    expect(high!.signal).toBeNull();
    // 0/25 with a lower limit of 0 can never fall below it.
    expect(none!.signal).toBeNull();
  });

  it('says a month outside its limits in words', () => {
    // p̄ = 16/125 = 0.128; n = 25 → upper 0.128 + 3√(0.128·0.872/25) = 0.3285; 9/25 = 0.36 is above
    // (Benneyan JC et al., Qual Saf Health Care 2003).
    const chart = pChart([
      { label: 'January', count: 1, total: 25 },
      { label: 'February', count: 2, total: 25 },
      { label: 'March', count: 2, total: 25 },
      { label: 'April', count: 2, total: 25 },
      { label: 'May', count: 9, total: 25 },
    ]);
    const may = chart.points[4]!;
    expect(may.upperLimit).toBeCloseTo(0.3285, 4);
    expect(may.signal).toBe('above-upper-limit');
    expect(pChartSignalWords(may)).toBe(
      'special-cause variation: May is above its upper 3-sigma limit',
    );
    expect(pChartSignalWords(chart.points[0]!)).toBe('within limits (common-cause variation)');
  });

  it('marks a month below a lower limit above 0', () => {
    // p̄ = 100/200 = 0.5; n = 100 → 0.35 to 0.65; 20/100 is below (Benneyan JC et al., 2003).
    const chart = pChart([
      { label: 'A', count: 80, total: 100 },
      { label: 'B', count: 20, total: 100 },
    ]);
    expect(chart.points[1]!.lowerLimit).toBeCloseTo(0.35, 12);
    expect(chart.points[1]!.signal).toBe('below-lower-limit');
    expect(chart.points[0]!.signal).toBe('above-upper-limit');
  });
});
