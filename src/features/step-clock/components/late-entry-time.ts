import { DateTime } from 'luxon';

export type LateEntryTime =
  { ok: true; atMs: number } | { ok: false; problem: 'unreadable' | 'future' | 'before-start' };

/**
 * The instant a nurse means by a ward-clock time typed for a missed tap ("23:50", "00:05:30"):
 * the latest moment at that time on the unit's clock that is not in the future. A session that
 * crossed midnight so reads "23:50" as the evening before, "00:05" as tonight. The server still
 * checks the instant against the session; this only picks the day.
 */
export function lateEntryInstant(
  text: string,
  { nowMs, startedMs, zone }: { nowMs: number; startedMs: number | null; zone: string },
): LateEntryTime {
  const match = /^(\d{1,2})[:.](\d{2})(?:[:.](\d{2}))?$/.exec(text.trim());
  if (!match) return { ok: false, problem: 'unreadable' };
  const [hour, minute, second] = [Number(match[1]), Number(match[2]), Number(match[3] ?? 0)];
  if (hour > 23 || minute > 59 || second > 59) return { ok: false, problem: 'unreadable' };
  const now = DateTime.fromMillis(nowMs, { zone });
  const onDay = (day: DateTime) => day.set({ hour, minute, second, millisecond: 0 }).toMillis();
  const today = onDay(now);
  const dayBefore = onDay(now.minus({ days: 1 }));
  const candidate = today <= nowMs ? today : dayBefore;
  if (startedMs === null || candidate >= startedMs) return { ok: true, atMs: candidate };
  if (today <= nowMs) return { ok: false, problem: 'before-start' };
  // Neither day fits: name the nearer miss, a slip ahead of the clock or a time before the start.
  return { ok: false, problem: today - nowMs < startedMs - dayBefore ? 'future' : 'before-start' };
}
