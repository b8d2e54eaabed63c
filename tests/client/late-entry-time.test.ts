import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { lateEntryInstant } from '../../src/features/step-clock/components/late-entry-time';

const zone = 'Europe/Lisbon';
const at = (iso: string) => DateTime.fromISO(iso, { zone }).toMillis();

describe('the day a missed tap’s ward-clock time is read on', () => {
  it('a session that crossed midnight reads a time before midnight as the evening before', () => {
    const span = { startedMs: at('2026-12-02T23:40:00'), nowMs: at('2026-12-03T00:10:00'), zone };
    expect(lateEntryInstant('23:55', span)).toEqual({ ok: true, atMs: at('2026-12-02T23:55:00') });
    expect(lateEntryInstant('00:05:30', span)).toEqual({
      ok: true,
      atMs: at('2026-12-03T00:05:30'),
    });
    // Before the start on the evening before, and a slip ahead of the clock, are named as such.
    expect(lateEntryInstant('23:30', span)).toEqual({ ok: false, problem: 'before-start' });
    expect(lateEntryInstant('00:20', span)).toEqual({ ok: false, problem: 'future' });
  });

  it('a session within one day reads the time today', () => {
    const span = { startedMs: at('2026-12-03T10:00:00'), nowMs: at('2026-12-03T10:40:00'), zone };
    expect(lateEntryInstant('10.15', span)).toEqual({ ok: true, atMs: at('2026-12-03T10:15:00') });
    expect(lateEntryInstant('09:50', span)).toEqual({ ok: false, problem: 'before-start' });
    expect(lateEntryInstant('11:40', span)).toEqual({ ok: false, problem: 'future' });
  });

  it('an unreadable time is refused as such', () => {
    const span = { startedMs: null, nowMs: at('2026-12-03T10:40:00'), zone };
    for (const text of ['', '24:00', '10:60', '1005', 'ten past'])
      expect(lateEntryInstant(text, span), text).toEqual({ ok: false, problem: 'unreadable' });
  });
});
