import { fieldLabel } from '../../../../shared/format/field-labels';

/** The three figures the pharmacist works out, in the order they are worked out. */
export const checkedFigures = ['bsaM2', 'doseMg', 'drugVolumeMl'] as const;
export type CheckedFigure = (typeof checkedFigures)[number];

/** Their names, from the one field table the server's messages use too. */
export const figureLabels: Record<CheckedFigure, string> = {
  bsaM2: fieldLabel('bsaM2'),
  doseMg: fieldLabel('doseMg'),
  drugVolumeMl: fieldLabel('drugVolumeMl'),
};

/** The same names inside a sentence. */
export const figureWords: Record<CheckedFigure, string> = {
  bsaM2: 'BSA',
  doseMg: 'dose',
  drugVolumeMl: 'drug volume',
};

export const figureUnits: Record<CheckedFigure, string> = {
  bsaM2: 'm²',
  doseMg: 'mg',
  drugVolumeMl: 'mL',
};

/** The server's range for each figure (shared/schemas/orders.ts doseCheckSchema). */
export const figureMaximum: Record<CheckedFigure, number> = {
  bsaM2: 5,
  doseMg: 100,
  drugVolumeMl: 100,
};

/** Which tolerance in the protocol applies to which figure. */
export const figureTolerance = {
  bsaM2: 'bsaPct',
  doseMg: 'dosePct',
  drugVolumeMl: 'drugVolumePct',
} as const satisfies Record<CheckedFigure, string>;

/** A second refused check sends the order back (server/pharmacy/service.ts refusalsBeforeReturn). */
export const refusalsBeforeReturn = 2;

export function isCheckedFigure(path: string): path is CheckedFigure {
  return (checkedFigures as readonly string[]).includes(path);
}
