import type { StepKind } from '../../../../shared/protocol/protocol-schema';
import {
  formatDuration,
  formatPlainNumber,
  formatUnitTime,
} from '../../../../shared/format/figures';
import { unitTimeZone } from '../../../config/unit-time-zone';

/**
 * Time left as mm:ss (h:mm:ss past an hour). Rounded up, so "00:00" shows only when the time is
 * really up and the display is never ahead of the truth by a whole second.
 */
export function formatRemaining(seconds: number): string {
  return formatDuration(Math.max(0, seconds), 'clock', { rounding: 'up' });
}

/** Time gone by, rounded down: "00:01" after one whole second. */
export function formatElapsed(seconds: number): string {
  return formatDuration(Math.max(0, seconds), 'clock', { rounding: 'down' });
}

/** The same time in words for a screen reader: "1 minute 23 seconds". */
export function spokenDuration(seconds: number, round: 'up' | 'down' = 'up'): string {
  return formatDuration(Math.max(0, seconds), 'spoken', { rounding: round });
}

/** A figure with at most `digits` decimals, as people write it ("600", "49.8", "0.25", "1800": no grouping). */
export function formatFigure(value: number, digits = 2): string {
  return formatPlainNumber(value, digits);
}

/** A moment on the ward clock (the unit's time zone, whatever the tablet's setting), with its zone's short name. */
export function formatWardTime(ms: number, withSeconds = true): string {
  return formatUnitTime(new Date(ms).toISOString(), unitTimeZone, withSeconds ? 'clock' : 'short');
}

/** The short name of a step in buttons and spoken lines: "Start laser", "End UV". */
export const stepNames: Record<StepKind, string> = {
  check: 'checks',
  preparation: 'preparation',
  infusion: 'infusion',
  wait: 'wait',
  light: 'laser',
  soak: 'soak',
  thickness: 'thickness check',
  swelling: 'swelling',
  uv: 'UV',
  aftercare: 'after-care',
};

export function capitalised(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/**
 * Steps whose end time is part of the dose (infusion, soak, light, UV) end with their own tap;
 * the others (a wait, a measurement, the checks) end when the next step starts.
 */
export const stepsEndedByTheirOwnTap: ReadonlySet<StepKind> = new Set([
  'infusion',
  'soak',
  'light',
  'uv',
]);

/** Milliseconds until a count-down shown rounded up changes its whole second. */
export function msUntilCountdownTicks(seconds: number): number {
  const shown = Math.ceil(seconds - 1e-6);
  return Math.max(0, (seconds - (shown - 1)) * 1000);
}

/** Milliseconds until a count-up shown rounded down changes its whole second. */
export function msUntilCountupTicks(seconds: number): number {
  return Math.max(0, (Math.floor(seconds + 1e-6) + 1 - seconds) * 1000);
}
