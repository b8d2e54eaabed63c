import { describe, expect, it } from 'vitest';
import {
  formatCalendarDate,
  formatDuration,
  formatQuantity,
  formatUnitMonth,
  formatUnitTime,
  setUnitLocale,
} from '../../shared/format/figures';
import { durationText } from '../../shared/session/deviations';

// No clinical figures here: the cases are plain arithmetic on seconds and the tz database's clock
// changes for Lisbon (WEST, UTC+1, until the last Sunday of October at 01:00 UTC; WET, UTC+0, after).

describe('a duration on the step clock', () => {
  it.each([
    [0, '00:00'],
    [59, '00:59'],
    [60, '01:00'],
    [83, '01:23'],
    [1800, '30:00'],
    [3600, '1:00:00'],
    [3723, '1:02:03'],
  ])('%d s reads %s', (seconds, text) => {
    expect(formatDuration(seconds, 'clock')).toBe(text);
  });

  it('a count-down rounds up and a count-up rounds down, so neither shows a second that has not yet passed', () => {
    expect(formatDuration(82.2, 'clock', { rounding: 'up' })).toBe('01:23');
    expect(formatDuration(83.8, 'clock', { rounding: 'down' })).toBe('01:23');
    expect(formatDuration(59.9999999, 'clock', { rounding: 'down' })).toBe('01:00');
  });
});

describe('a beyond-use countdown', () => {
  it.each([
    [0, '00:00:00'],
    [83, '00:01:23'],
    [14400, '04:00:00'],
  ])('%d s reads %s', (seconds, text) => {
    expect(formatDuration(seconds, 'hours-clock')).toBe(text);
  });

  it('rounds down, as the countdown always has', () => {
    expect(formatDuration(14399.9, 'hours-clock', { rounding: 'down' })).toBe('03:59:59');
  });
});

describe('a duration spoken by a screen reader on the step clock', () => {
  it.each([
    [0, '0 seconds'],
    [1, '1 second'],
    [60, '1 minute'],
    [83, '1 minute 23 seconds'],
    [3723, '1 hour 2 minutes 3 seconds'],
  ])('%d s reads %s', (seconds, text) => {
    expect(formatDuration(seconds, 'spoken')).toBe(text);
  });
});

describe('a duration in words, as records, sheets and e-mails print it', () => {
  it.each([
    [0, '0 s'],
    [59, '59 s'],
    [60, '1 min'],
    [83, '1 min 23 s'],
    [1800, '30 min'],
    [3600, '1 h'],
    [3723, '1 h 2 min 3 s'],
    [83.4, '1 min 23 s'],
  ])('%d s reads %s', (seconds, text) => {
    expect(formatDuration(seconds, 'words')).toBe(text);
  });

  it('UV time of 1800 s never prints with a thousands separator', () => {
    expect(formatDuration(1800, 'seconds-and-words')).toBe('1800 s (30 min)');
    expect(formatQuantity(1800, 's')).toBe('1800 s');
  });

  it('a planned time under a minute needs no words beside it; over a minute it has them', () => {
    expect(formatDuration(59, 'seconds-and-words')).toBe('59 s');
    expect(formatDuration(83, 'seconds-and-words')).toBe('83 s (1 min 23 s)');
    expect(formatDuration(83.25, 'seconds-and-words')).toBe('83.25 s (1 min 23 s)');
    expect(formatDuration(545.454545, 'seconds-and-words', { maxDecimals: 6 })).toBe(
      '545.454545 s (9 min 5 s)',
    );
  });

  it('a negative, missing or non-numeric duration prints as a dash, never as 0 or "NaN"', () => {
    for (const style of ['clock', 'hours-clock', 'words', 'seconds-and-words', 'spoken'] as const) {
      expect(formatDuration(-1, style)).toBe('—');
      expect(formatDuration(Number.NaN, style)).toBe('—');
      expect(formatDuration(Number.POSITIVE_INFINITY, style)).toBe('—');
      expect(formatDuration(null, style)).toBe('—');
      expect(formatDuration(undefined, style)).toBe('—');
    }
  });
});

describe('a duration in a deviation message', () => {
  it('reads as the records read it, keeping a sign for an early figure and a tenth of a second under a minute', () => {
    expect(durationText(14401)).toBe('4 h 1 s');
    expect(durationText(1800)).toBe(formatDuration(1800, 'words'));
    expect(durationText(-150)).toBe('−2 min 30 s');
    expect(durationText(41.25)).toBe('41.3 s');
  });
});

describe('a number with its unit', () => {
  it('keeps at most two decimals by default, drops trailing zeros and never groups thousands', () => {
    expect(formatQuantity(12.5, 'J/cm²')).toBe('12.5 J/cm²');
    expect(formatQuantity(0.256, 'mL')).toBe('0.26 mL');
    expect(formatQuantity(3800, 'µm')).toBe('3800 µm');
    expect(formatQuantity(49.8, 'mW', 0)).toBe('50 mW');
    expect(formatQuantity(-2.5, '%')).toBe('-2.5 %');
  });

  it('prints a missing or non-numeric figure as a dash, without its unit', () => {
    expect(formatQuantity(null, 'mg')).toBe('—');
    expect(formatQuantity(Number.NaN, 'mg')).toBe('—');
  });
});

describe('a moment on the unit clock, with the zone’s short name', () => {
  it('names WEST on the Saturday before the autumn change in Lisbon and WET on the Sunday after it', () => {
    expect(formatUnitTime('2026-10-24T13:05:00Z', 'Europe/Lisbon', 'sheet')).toBe(
      'Saturday 24 October 2026, 14:05 WEST',
    );
    expect(formatUnitTime('2026-10-25T14:05:00Z', 'Europe/Lisbon', 'sheet')).toBe(
      'Sunday 25 October 2026, 14:05 WET',
    );
  });

  it('prints a December afternoon in Lisbon short or for a sheet, whatever offset the instant was written with', () => {
    expect(formatUnitTime('2026-12-03T14:05:00Z', 'Europe/Lisbon', 'sheet')).toBe(
      'Thursday 3 December 2026, 14:05 WET',
    );
    expect(formatUnitTime('2026-12-03T15:05:00+01:00', 'Europe/Lisbon', 'short')).toBe('14:05 WET');
    expect(formatUnitTime('2026-12-03T23:30:00Z', 'Europe/Lisbon', 'day')).toBe(
      'Thursday 3 December 2026',
    );
  });

  it('names an American zone by its US abbreviation', () => {
    expect(formatUnitTime('2026-07-03T14:00:00Z', 'America/New_York', 'short')).toBe('10:00 EDT');
  });

  it('prints a missing instant as a dash and an unreadable one as it was given', () => {
    expect(formatUnitTime(null, 'Europe/Lisbon', 'short')).toBe('—');
    expect(formatUnitTime('not a date', 'Europe/Lisbon', 'short')).toBe('not a date');
  });
});

// Europe/London: GMT (UTC+0) in winter, BST (UTC+1) from the last Sunday of March at 01:00 UTC.
describe('a unit time in each style, in a zone the config may name', () => {
  it('names BST after the spring change in London and GMT before it, in every style that shows a time', () => {
    expect(formatUnitTime('2026-03-29T00:30:00Z', 'Europe/London', 'record')).toBe(
      '29/03/2026, 00:30 GMT',
    );
    expect(formatUnitTime('2026-03-29T01:30:00Z', 'Europe/London', 'record')).toBe(
      '29/03/2026, 02:30 BST',
    );
    expect(formatUnitTime('2026-03-29T01:30:09Z', 'Europe/London', 'clock')).toBe('02:30:09 BST');
    expect(formatUnitTime('2026-03-29T01:30:09Z', 'Europe/London', 'short')).toBe('02:30 BST');
    expect(formatUnitTime('2026-03-29T01:30:09Z', 'Europe/London', 'sheet')).toBe(
      'Sunday 29 March 2026, 02:30 BST',
    );
  });

  it('prints a calendar date without a zone, on the unit’s day rather than UTC’s', () => {
    // 23:30 UTC on 3 December is already 4 December in Tokyo (UTC+9).
    expect(formatUnitTime('2026-12-03T23:30:00Z', 'Asia/Tokyo', 'date')).toBe('04/12/2026');
    expect(formatUnitTime('2026-12-03T23:30:00Z', 'Europe/Lisbon', 'date')).toBe('03/12/2026');
  });

  it('writes dates in the unit’s locale, whatever the machine’s: day/month/year for en-GB, month first for en-US', () => {
    try {
      setUnitLocale('en-US');
      expect(formatUnitTime('2026-12-03T14:05:00Z', 'Europe/Lisbon', 'record')).toBe(
        '12/3/2026, 14:05 WET',
      );
      expect(formatCalendarDate('1956-03-14')).toBe('3/14/1956');
      setUnitLocale('not a locale');
      expect(formatCalendarDate('1956-03-14')).toBe('3/14/1956');
    } finally {
      setUnitLocale('en-GB');
    }
    expect(formatUnitTime('2026-12-03T14:05:00Z', 'Europe/Lisbon', 'record')).toBe(
      '03/12/2026, 14:05 WET',
    );
    expect(formatCalendarDate('1956-03-14')).toBe('14/03/1956');
    expect(formatCalendarDate('1956-03-14', 'day')).toBe('Wednesday 14 March 1956');
    expect(formatCalendarDate(null)).toBe('—');
    expect(formatUnitMonth('2026-11')).toBe('Nov 2026');
    expect(formatUnitMonth('2026-11', 'long')).toBe('November 2026');
  });

  it('writes ISO 8601 with the zone’s offset for an export, the same instant as stored', () => {
    const iso = formatUnitTime('2026-07-03T09:05:00.250Z', 'Europe/London', 'iso');
    expect(iso).toBe('2026-07-03T10:05:00.250+01:00');
    expect(Date.parse(iso)).toBe(Date.parse('2026-07-03T09:05:00.250Z'));
    expect(formatUnitTime('2026-12-03T09:05:00Z', 'Europe/London', 'iso')).toBe(
      '2026-12-03T09:05:00.000+00:00',
    );
  });

  it('names a zone with no English abbreviation by its offset, never by a wrong name', () => {
    expect(formatUnitTime('2026-12-03T09:05:00Z', 'Asia/Tokyo', 'short')).toBe('18:05 GMT+9');
  });

  it('prints a missing instant as a dash in every style', () => {
    for (const style of ['sheet', 'record', 'short', 'clock', 'day', 'date', 'iso'] as const)
      expect(formatUnitTime(undefined, 'Europe/London', style)).toBe('—');
  });
});

describe('UV time read the same way wherever it is printed', () => {
  // 3 mW/cm² × 1800 s = 5.4 J/cm² (Wollensak G, Spoerl E, Seiler T. Am J Ophthalmol 2003).
  it('1800 s is "1800 s (30 min)" as a planned time and "30 min" in words, never "1,800 s"', () => {
    expect(formatDuration(1800, 'seconds-and-words', { maxDecimals: 0 })).toBe('1800 s (30 min)');
    expect(formatDuration(1800, 'words')).toBe('30 min');
    expect(formatQuantity(1800, 's')).toBe('1800 s');
    expect(formatDuration(1800.3, 'seconds-and-words', { maxDecimals: 1 })).toBe(
      '1800.3 s (30 min)',
    );
  });
});
