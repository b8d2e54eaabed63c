export const bsaFormulaNames = ['mosteller', 'du-bois', 'haycock', 'gehan-george', 'boyd'] as const;
export type BsaFormulaName = (typeof bsaFormulaNames)[number];

export interface BsaFormula {
  label: string;
  /** The expression as printed in the plan's working (height in cm, weight in kg). */
  expression: string;
  source: string;
  bsaM2: (heightCm: number, weightKg: number) => number;
}

export const bsaFormulas: Record<BsaFormulaName, BsaFormula> = {
  mosteller: {
    label: 'Mosteller',
    expression: '√(heightCm × weightKg ÷ 3600)',
    source: 'Mosteller RD. Simplified calculation of body-surface area. N Engl J Med 1987;317:1098',
    bsaM2: (heightCm, weightKg) => Math.sqrt((heightCm * weightKg) / 3600),
  },
  'du-bois': {
    label: 'Du Bois',
    expression: '0.007184 × weightKg^0.425 × heightCm^0.725',
    source: 'Du Bois D, Du Bois EF. Arch Intern Med 1916;17:863–871',
    bsaM2: (heightCm, weightKg) => 0.007184 * weightKg ** 0.425 * heightCm ** 0.725,
  },
  haycock: {
    label: 'Haycock',
    expression: '0.024265 × weightKg^0.5378 × heightCm^0.3964',
    source: 'Haycock GB, Schwartz GJ, Wisotsky DH. J Pediatr 1978;93:62–66',
    bsaM2: (heightCm, weightKg) => 0.024265 * weightKg ** 0.5378 * heightCm ** 0.3964,
  },
  'gehan-george': {
    label: 'Gehan–George',
    expression: '0.0235 × weightKg^0.51456 × heightCm^0.42246',
    source: 'Gehan EA, George SL. Cancer Chemother Rep 1970;54:225–235',
    bsaM2: (heightCm, weightKg) => 0.0235 * weightKg ** 0.51456 * heightCm ** 0.42246,
  },
  boyd: {
    label: 'Boyd',
    expression:
      '0.0003207 × heightCm^0.3 × weightG^(0.7285 − 0.0188 × log10 weightG), weightG = weightKg × 1000',
    source:
      'Boyd E. The Growth of the Surface Area of the Human Body. University of Minnesota Press, 1935 (formula published; citation from memory)',
    bsaM2: (heightCm, weightKg) => {
      const weightG = weightKg * 1000;
      return 0.0003207 * heightCm ** 0.3 * weightG ** (0.7285 - 0.0188 * Math.log10(weightG));
    },
  },
};

/** Body surface area in m² by the named formula; height in cm, weight in kg. */
export function computeBsaM2(formula: BsaFormulaName, heightCm: number, weightKg: number): number {
  return bsaFormulas[formula].bsaM2(heightCm, weightKg);
}
