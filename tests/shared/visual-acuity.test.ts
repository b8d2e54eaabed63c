import { describe, expect, it } from 'vitest';
import { PlanInputError } from '../../shared/engine/plan-input-error';
import {
  acuityFromEntry,
  letterChangeFromLogMarChange,
  lettersFromLogMar,
} from '../../shared/engine/visual-acuity';

const logMarOf = (notation: Parameters<typeof acuityFromEntry>[0]['notation'], value: string) =>
  acuityFromEntry({ notation, value }).logMar;

function refusal(notation: Parameters<typeof acuityFromEntry>[0]['notation'], value: string) {
  try {
    acuityFromEntry({ notation, value });
  } catch (error) {
    if (error instanceof PlanInputError) return error.fields[0]!;
    throw error;
  }
  throw new Error(`${notation} ${value} was accepted`);
}

describe('visual acuity entered in the clinic’s notation is stored as logMAR', () => {
  it('reads normal acuity the same in every notation: 6/6 = 20/20 = 1.0 = logMAR 0.0 = 85 letters', () => {
    // logMAR = −log10(decimal) (definition); 85 letters at logMAR 0 (Gregori NZ et al., Retina 2010).
    expect(logMarOf('snellen-m', '6/6')).toBe(0);
    expect(logMarOf('snellen-ft', '20/20')).toBe(0);
    expect(logMarOf('decimal', '1.0')).toBe(0);
    expect(logMarOf('logmar', '0.0')).toBe(0);
    expect(logMarOf('etdrs-letters', '85')).toBe(0);
    expect(acuityFromEntry({ notation: 'snellen-m', value: '6/6' }).letters).toBe(85);
  });

  it('reads 6/12 = 20/40 = 0.5 as logMAR 0.30 and 70 letters', () => {
    // −log10(0.5) = 0.301 (definition); 85 − 50 × 0.30 = 70 letters (Gregori NZ et al., Retina 2010).
    expect(logMarOf('snellen-m', '6/12')).toBe(0.3);
    expect(logMarOf('snellen-ft', '20/40')).toBe(0.3);
    expect(logMarOf('decimal', '0.5')).toBe(0.3);
    expect(logMarOf('etdrs-letters', '70')).toBe(0.3);
    expect(acuityFromEntry({ notation: 'snellen-ft', value: '20/40' }).letters).toBe(70);
  });

  it('reads 6/60 = 20/200 = 0.1 as logMAR 1.0 and 35 letters', () => {
    // −log10(0.1) = 1.0 (definition); 85 − 50 × 1.0 = 35 letters (Gregori NZ et al., Retina 2010).
    expect(logMarOf('snellen-m', '6/60')).toBe(1);
    expect(logMarOf('snellen-ft', '20/200')).toBe(1);
    expect(logMarOf('decimal', '0.1')).toBe(1);
    expect(acuityFromEntry({ notation: 'snellen-m', value: '6/60' }).letters).toBe(35);
  });

  it('keeps the entry as typed beside the logMAR, and shows the working', () => {
    const acuity = acuityFromEntry({ notation: 'snellen-ft', value: '20/80' });
    // −log10(20/80) = 0.602 → 0.60; 85 − 30 = 55 letters (Gregori NZ et al., Retina 2010).
    expect(acuity).toMatchObject({ entry: '20/80', logMar: 0.6, letters: 55 });
    expect(acuity.working).toBe('logMAR = −log10(20/80) = 0.60');
  });

  it('gives counting fingers and hand motion their measured equivalents', () => {
    // CF = decimal 0.014 → logMAR 1.85; HM = decimal 0.005 → logMAR 2.30
    // (Schulze-Bonsel K et al., Invest Ophthalmol Vis Sci 2006, abstract).
    expect(logMarOf('counting-fingers', '')).toBe(1.85);
    expect(logMarOf('hand-motion', '')).toBe(2.3);
  });

  it('turns a logMAR change into letters: 0.1 logMAR worse is 5 letters lost', () => {
    // 50 letters per logMAR unit (Gregori NZ et al., Retina 2010).
    expect(letterChangeFromLogMarChange(0.1)).toBeCloseTo(-5, 10);
    expect(letterChangeFromLogMarChange(-0.3)).toBeCloseTo(15, 10);
    expect(lettersFromLogMar(1)).toBe(35);
  });
});

describe('impossible acuity entries are refused, naming the field and the allowed range', () => {
  it('refuses 6/0 and 20/0', () => {
    const metres = refusal('snellen-m', '6/0');
    expect(metres.path).toBe('acuity.value');
    expect(metres.message).toContain('letter size must be 3 to 600 m');
    expect(refusal('snellen-ft', '20/0').message).toContain('10 to 2000 ft');
  });

  it('refuses negative letters and letters beyond the chart', () => {
    expect(refusal('etdrs-letters', '-5').message).toContain('whole number from 0 to 100');
    expect(refusal('etdrs-letters', '101').message).toContain('0 to 100');
    expect(refusal('etdrs-letters', '70.5').message).toContain('whole number');
  });

  it('refuses a decimal of 0 or above 2, a logMAR off the chart, and text', () => {
    expect(refusal('decimal', '0').message).toContain('0.01 to 2');
    expect(refusal('decimal', '3').message).toContain('0.01 to 2');
    expect(refusal('logmar', '-0.5').message).toContain('-0.3 to 2');
    expect(refusal('logmar', 'good').message).toContain('must be a number');
    expect(refusal('snellen-m', '6-12').message).toContain('e.g. 6/12');
    expect(refusal('snellen-m', '60/12').message).toContain('test distance must be 1 to 6 m');
  });
});
