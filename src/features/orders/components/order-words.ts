import type { Eye } from '../../../../shared/schemas/patients';

export const eyeWords: Record<Eye, string> = { right: 'Right eye', left: 'Left eye' };
export const kindWords = {
  pdt: 'Photodynamic therapy (PDT)',
  cxl: 'Corneal cross-linking (CXL)',
} as const;

/** Field names of the order API as a person reads them. */
export const fieldWords: Record<string, string> = {
  'inputs.height': 'height',
  'inputs.height.value': 'height',
  'inputs.weight': 'weight',
  'inputs.weight.value': 'weight',
  'inputs.lesionGldUm': 'lesion greatest linear dimension',
  'inputs.lensMagnification': 'lens laser-spot magnification',
  'inputs.stromalThicknessUm': 'stromal thickness',
  'inputs.bsaFormula': 'BSA formula',
  bmiKgPerM2: 'body-mass index',
};
