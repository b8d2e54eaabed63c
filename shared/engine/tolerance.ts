/**
 * The percent-tolerance comparison, used wherever a figure is held against another within a
 * percentage: the blind dose check, the preparation band, a protocol's own consistency checks and
 * the light calculator's agreement. True when `figure` lies within `pct` percent of `reference`
 * (1e-9 of slack, so a figure exactly on the edge is not lost to floating-point noise).
 */
export function withinPct(figure: number, reference: number, pct: number): boolean {
  return Math.abs(figure - reference) <= (Math.abs(reference) * pct) / 100 + 1e-9;
}
