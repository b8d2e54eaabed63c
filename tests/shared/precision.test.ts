import { describe, expect, it } from 'vitest';
import {
  exportNumber,
  formatFigurePair,
  formatReading,
  roundForReading,
} from '../../shared/format/precision';
import { csvField, csvLine, csvReading } from '../../server/review/csv';

// The reading steps are common practice (what a syringe, a pump, a laser display and a clock
// show); the figures are plain arithmetic unless a source is named beside them.

describe('a figure at the precision people read it', () => {
  it('a volume reads to the syringe graduation, and to 0.1 mL without one', () => {
    // 29.99235 mL is what a rate × time works out to; nobody reads a syringe to 5 decimals.
    expect(formatReading('volumeMl', 29.99235, { graduationMl: 0.01 })).toBe('29.99 mL'); // common practice
    expect(formatReading('volumeMl', 29.99235)).toBe('30 mL'); // common practice
    expect(formatReading('volumeMl', 5.466, { graduationMl: 0.2 })).toBe('5.4 mL'); // common practice
  });

  it('fluence reads to 0.1 J/cm²: 600 mW/cm² × 83 s = 49.8 J/cm² (TAP Study Group, Arch Ophthalmol 1999)', () => {
    expect(formatReading('fluenceJPerCm2', (600 * 83) / 1000)).toBe('49.8 J/cm²');
    // 3 mW/cm² × 1800 s = 5.4 J/cm² (Caporossi A et al., J Cataract Refract Surg 2006)
    expect(formatReading('fluenceJPerCm2', (3 * 1800) / 1000)).toBe('5.4 J/cm²');
    expect(formatReading('fluenceJPerCm2', 49.84999)).toBe('49.8 J/cm²'); // common practice
  });

  it('a duration reads to the whole second, a dose to 0.01 mg, a thickness to the µm', () => {
    expect(formatReading('durationS', 83.4)).toBe('83 s'); // common practice
    expect(formatReading('doseMg', 10.9086)).toBe('10.91 mg'); // common practice
    expect(formatReading('thicknessUm', 412.6)).toBe('413 µm'); // common practice
  });

  it('a missing figure reads as a dash, never as 0', () => {
    expect(formatReading('doseMg', null)).toBe('—');
    expect(roundForReading('doseMg', Number.NaN)).toBeNull();
  });

  it('binary noise never reaches the figure', () => {
    expect(roundForReading('fluenceJPerCm2', 0.1 + 0.2)).toBe(0.3);
    expect(roundForReading('volumeMl', 0.020000000000000004, { graduationMl: 0.01 })).toBe(0.02);
  });
});

describe('a number in an export', () => {
  it('is written without binary noise or grouping', () => {
    expect(exportNumber(0.1 * 0.2)).toBe('0.02');
    expect(exportNumber(0.020000000000000004)).toBe('0.02');
    expect(exportNumber(0.1 + 0.2)).toBe('0.3');
    expect(exportNumber(1800)).toBe('1800');
    expect(exportNumber(1e12)).toBe('1000000000000');
    expect(exportNumber(-1.5)).toBe('-1.5');
    expect(exportNumber(0)).toBe('0');
    expect(exportNumber(Number.NaN)).toBe('');
  });

  it('a CSV line carries a float-noise value as people would write it', () => {
    expect(csvField(0.020000000000000004)).toBe('0.02');
    expect(csvLine([7, 0.1 + 0.2, 'text, with comma', null])).toBe('7,0.3,"text, with comma",\r\n');
    // A DECIMAL column comes back as text; a volume worked out from rate × time is read to 0.1 mL.
    expect(csvField(csvReading('volumeMl', '29.99235'))).toBe('30'); // common practice
    expect(csvField(csvReading('fluenceJPerCm2', 49.800000000000004))).toBe('49.8');
  });
});

describe('an expected and an actual figure that would read the same', () => {
  it('durations read in words, and differ at the second', () => {
    // 10 min planned (TAP Study Group, Arch Ophthalmol 1999) against 10 min 59 s
    expect(formatFigurePair(10, 10 + 59 / 60, 'min')).toEqual({
      expected: '10 min',
      actual: '10 min 59 s',
    });
  });

  it('"4 h → 4 h" shows the figures that differ', () => {
    // A 4 h limit (common practice) passed by 0.4 s: words alone would read "4 h" twice.
    const pair = formatFigurePair(4, 4 + 0.4 / 3600, 'h');
    expect(pair.expected).not.toBe(pair.actual);
    expect(pair).toEqual({ expected: '4 h 0 s', actual: '4 h 0.4 s' });
  });

  it('figures in other units get more decimals until they differ', () => {
    expect(formatFigurePair(50, 50.04, 'J/cm²')).toEqual({
      expected: '50 J/cm²',
      actual: '50.04 J/cm²',
    });
    expect(formatFigurePair(50, 47.5, 'J/cm²')).toEqual({
      expected: '50 J/cm²',
      actual: '47.5 J/cm²',
    });
  });

  it('equal figures stay as they are', () => {
    expect(formatFigurePair(4, 4, 'h')).toEqual({ expected: '4 h', actual: '4 h' });
    expect(formatFigurePair(null, 3, 'answers')).toEqual({ expected: '—', actual: '3 answers' });
  });
});

describe('a time zone in plain words', () => {
  it('names the city of the IANA zone', async () => {
    const { zonePlainName } = await import('../../shared/format/precision');
    expect(zonePlainName('Europe/Lisbon')).toBe('Lisbon time');
    expect(zonePlainName('America/New_York')).toBe('New York time');
    expect(zonePlainName('UTC')).toBe('UTC');
  });
});
