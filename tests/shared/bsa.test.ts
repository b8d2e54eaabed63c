import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bsaFormulaNames, computeBsaM2 } from '../../shared/engine/bsa';

describe('body surface area', () => {
  // Check values are the arithmetic of each published formula for 170 cm and 70 kg:
  // Mosteller RD, N Engl J Med 1987; Du Bois D & Du Bois EF, Arch Intern Med 1916;
  // Haycock GB et al., J Pediatr 1978; Gehan EA & George SL, Cancer Chemother Rep 1970;
  // Boyd E, 1935 (formula published; citation from memory).
  it.each([
    ['mosteller', 1.8181],
    ['du-bois', 1.8097],
    ['haycock', 1.8257],
    ['gehan-george', 1.8313],
    ['boyd', 1.8347],
  ] as const)('%s gives %f m² for 170 cm and 70 kg', (formula, expectedM2) => {
    const bsaM2 = computeBsaM2(formula, 170, 70);

    expect(bsaM2).toBeCloseTo(expectedM2, 4);
  });

  it.each(bsaFormulaNames)(
    '%s grows with height at a fixed weight and with weight at a fixed height',
    (formula) => {
      const heightCm = fc.double({ min: 100, max: 230, noNaN: true });
      const weightKg = fc.double({ min: 25, max: 250, noNaN: true });
      fc.assert(
        fc.property(heightCm, heightCm, weightKg, (a, b, weight) => {
          fc.pre(Math.abs(a - b) > 1e-6);
          const [shorter, taller] = a < b ? [a, b] : [b, a];

          expect(computeBsaM2(formula, taller, weight)).toBeGreaterThan(
            computeBsaM2(formula, shorter, weight),
          );
        }),
      );
      fc.assert(
        fc.property(weightKg, weightKg, heightCm, (a, b, height) => {
          fc.pre(Math.abs(a - b) > 1e-6);
          const [lighter, heavier] = a < b ? [a, b] : [b, a];

          expect(computeBsaM2(formula, height, heavier)).toBeGreaterThan(
            computeBsaM2(formula, height, lighter),
          );
        }),
      );
    },
  );
});
