/**
 * Proportions as a quality team reads them: a share with its Wilson score interval, and the
 * p-chart that tells a month's special-cause variation from the common-cause noise.
 */

/** The two-sided 95 % normal quantile. */
export const z95 = 1.959963984540054;

export interface ShareWithInterval {
  count: number;
  total: number;
  /** count ÷ total; null when total is 0. */
  share: number | null;
  lower: number | null;
  upper: number | null;
}

/**
 * Wilson score interval (Wilson EB. J Am Stat Assoc 1927;22:209–212): unlike the plain
 * p ± z·√(p(1−p)/n) it stays inside 0–1 and keeps its width at 0 or n successes.
 */
export function wilsonInterval(count: number, total: number, z = z95): ShareWithInterval {
  if (!Number.isInteger(count) || !Number.isInteger(total) || count < 0 || total < 0)
    throw new RangeError('count and total must be whole numbers of at least 0');
  if (count > total) throw new RangeError('count cannot exceed total');
  if (total === 0) return { count, total, share: null, lower: null, upper: null };
  const p = count / total;
  const z2 = z * z;
  const denominator = 1 + z2 / total;
  const centre = (p + z2 / (2 * total)) / denominator;
  const half = (z / denominator) * Math.sqrt((p * (1 - p)) / total + z2 / (4 * total * total));
  return {
    count,
    total,
    share: p,
    // At 0 or n successes the bound is exactly 0 or 1; arithmetic would leave a hair off.
    lower: count === 0 ? 0 : Math.max(0, centre - half),
    upper: count === total ? 1 : Math.min(1, centre + half),
  };
}

export interface PChartInput {
  label: string;
  /** Events (e.g. sessions with a deviation) in the period. */
  count: number;
  /** Opportunities (e.g. sessions) in the period. */
  total: number;
}

export interface PChartPoint extends PChartInput {
  share: number | null;
  /** The 3-sigma limits from this period's own total; null for an empty period. */
  lowerLimit: number | null;
  upperLimit: number | null;
  signal: 'above-upper-limit' | 'below-lower-limit' | null;
}

export interface PChart {
  /** p̄: all events over all opportunities; null when there are none. */
  centre: number | null;
  points: PChartPoint[];
}

/**
 * p-chart with 3-sigma limits, each period's from its own n: p̄ ± 3·√(p̄(1−p̄)/n), held inside
 * 0–1 (Benneyan JC, Lloyd RC, Plsek PE. Statistical process control as a tool for research and
 * healthcare improvement. Qual Saf Health Care 2003;12:458–464). A period outside its limits is
 * special-cause variation; the other rules of that paper (runs, trends) are not applied here.
 */
export function pChart(periods: PChartInput[]): PChart {
  const events = periods.reduce((sum, p) => sum + p.count, 0);
  const opportunities = periods.reduce((sum, p) => sum + p.total, 0);
  const centre = opportunities === 0 ? null : events / opportunities;
  const slack = 1e-12;
  return {
    centre,
    points: periods.map((period) => {
      if (centre === null || period.total === 0)
        return { ...period, share: null, lowerLimit: null, upperLimit: null, signal: null };
      const sigma = Math.sqrt((centre * (1 - centre)) / period.total);
      const lowerLimit = Math.max(0, centre - 3 * sigma);
      const upperLimit = Math.min(1, centre + 3 * sigma);
      const share = period.count / period.total;
      const signal =
        share > upperLimit + slack
          ? 'above-upper-limit'
          : lowerLimit > 0 && share < lowerLimit - slack
            ? 'below-lower-limit'
            : null;
      return { ...period, share, lowerLimit, upperLimit, signal };
    }),
  };
}

/** A p-chart signal in words, for the table and the screen reader. */
export function pChartSignalWords(point: PChartPoint): string {
  if (point.signal === 'above-upper-limit')
    return `special-cause variation: ${point.label} is above its upper 3-sigma limit`;
  if (point.signal === 'below-lower-limit')
    return `special-cause variation: ${point.label} is below its lower 3-sigma limit`;
  return point.share === null ? 'no cases' : 'within limits (common-cause variation)';
}
