import { describe, expect, it } from 'vitest';
import { formatCalendarDate, parseUnitDate, unitDatePattern } from '../../src/lib/unit-times';

// The demo unit's locale is en-GB: day/month/year. No clinical figures here.

describe('a date in the unit’s locale', () => {
  it('is written day/month/year for en-GB, whatever the browser’s own locale', () => {
    expect(unitDatePattern()).toBe('DD/MM/YYYY');
    expect(formatCalendarDate('1961-07-21')).toBe('21/07/1961');
  });

  it('is read day first, with / . or - between the parts, and as YYYY-MM-DD', () => {
    expect(parseUnitDate('21/07/1961')).toBe('1961-07-21');
    expect(parseUnitDate('3.12.2026')).toBe('2026-12-03');
    expect(parseUnitDate('03-12-2026')).toBe('2026-12-03');
    expect(parseUnitDate('2026-12-03')).toBe('2026-12-03');
  });

  it('refuses what is not a real date, or a year that is not written in full', () => {
    expect(parseUnitDate('31/02/2026')).toBeNull();
    expect(parseUnitDate('12/13/2026')).toBeNull();
    expect(parseUnitDate('03/12/26')).toBeNull();
    expect(parseUnitDate('yesterday')).toBeNull();
  });
});
