import fc from 'fast-check';
import * as mathjs from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeBsaM2 } from '../../shared/engine/bsa';
import { inchesToCm, lengthToCm, massToKg, poundsToKg } from '../../shared/engine/units';

// mathjs, a general-purpose reference library, is the yardstick here: the engine's trimmed
// mathjs instance must convert exactly as the full library does.
describe('unit conversion', () => {
  it('converts inches to centimetres as the full mathjs does', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 120, noNaN: true }), (inches) => {
        expect(inchesToCm(inches)).toBeCloseTo(mathjs.unit(inches, 'in').toNumber('cm'), 10);
      }),
    );
  });

  it('converts pounds to kilograms as the full mathjs does', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 700, noNaN: true }), (pounds) => {
        expect(poundsToKg(pounds)).toBeCloseTo(mathjs.unit(pounds, 'lb').toNumber('kg'), 10);
      }),
    );
  });

  it('uses the international definitions: 70 in is 177.8 cm and 154 lb is 69.853 kg', () => {
    // 1 in = 2.54 cm, 1 lb = 0.45359237 kg (international yard and pound, 1959; fact of the trade).
    expect(inchesToCm(70)).toBeCloseTo(177.8, 10);
    expect(poundsToKg(154)).toBeCloseTo(69.85322498, 8);
  });

  it('passes centimetres and kilograms through unchanged and converts metres', () => {
    expect(lengthToCm(170, 'cm')).toBe(170);
    expect(massToKg(70, 'kg')).toBe(70);
    expect(lengthToCm(1.7, 'm')).toBeCloseTo(170, 10);
  });

  it('Mosteller from metric inputs agrees with its imperial form √(in × lb ÷ 3131) to 0.15%', () => {
    // Mosteller RD, N Engl J Med 1987: the imperial constant 3131 is itself rounded, hence the margin.
    fc.assert(
      fc.property(
        fc.double({ min: 40, max: 90, noNaN: true }),
        fc.double({ min: 55, max: 550, noNaN: true }),
        (heightIn, weightLb) => {
          const imperialM2 = Math.sqrt((heightIn * weightLb) / 3131);

          const metricM2 = computeBsaM2('mosteller', inchesToCm(heightIn), poundsToKg(weightLb));

          expect(Math.abs(metricM2 - imperialM2) / imperialM2).toBeLessThan(0.0015);
        },
      ),
    );
  });
});
