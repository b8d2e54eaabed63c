/** A figure exactly at its tolerance is within it; the slack only absorbs binary noise. */
const noiseSlack = 1e-9;

/**
 * The percent-tolerance comparison, used wherever a figure is held against another within a
 * percentage: the blind dose check, the preparation band, a protocol's own consistency checks and
 * the light calculator's agreement. True when `figure` lies within `pct` percent of `reference`
 * (1e-9 of slack, so a figure exactly on the edge is not lost to floating-point noise).
 */
export function withinPct(figure: number, reference: number, pct: number): boolean {
  return Math.abs(figure - reference) <= (Math.abs(reference) * pct) / 100 + noiseSlack;
}

/** True when `figure` lies within `tolerance` (same unit) of `reference`, edges included. */
export function withinAbs(figure: number, reference: number, tolerance: number): boolean {
  return Math.abs(figure - reference) <= tolerance + noiseSlack;
}

/** True when `figure` is beyond `limit`; a figure exactly on the limit is not. */
export function exceeds(figure: number, limit: number): boolean {
  return figure > limit + noiseSlack;
}
