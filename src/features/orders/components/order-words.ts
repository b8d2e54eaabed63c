import type { OrderStatus } from '../../../../shared/schemas/orders';
import type { Eye } from '../../../../shared/schemas/patients';

export const eyeWords: Record<Eye, string> = { right: 'Right eye', left: 'Left eye' };
export const kindWords = { pdt: 'Photodynamic therapy (PDT)', cxl: 'Corneal cross-linking (CXL)' } as const;

export const statusWords: Record<OrderStatus, string> = {
  draft: 'Draft',
  signed: 'Signed',
  returned: 'Sent back',
  checked: 'Dose checked',
  prepared: 'Prepared',
  ready: 'Ready',
  'in-session': 'In session',
  completed: 'Completed',
  stopped: 'Stopped early',
  reviewed: 'Reviewed',
  superseded: 'Replaced by an amendment',
};

/** What each status means for the next person, in one line. */
export const statusMeanings: Record<OrderStatus, string> = {
  draft: 'Not signed yet; it can still be edited.',
  signed: 'Signed by the clinician; waits for the pharmacist’s independent dose check.',
  returned: 'Sent back by the pharmacist after the dose check twice disagreed; amend it or leave it.',
  checked: 'The pharmacist’s own figures matched the plan; waits for preparation.',
  prepared: 'The drug is made up; the beyond-use time runs.',
  ready: 'Ready for the session.',
  'in-session': 'The session is running on the step clock.',
  completed: 'The treatment was given.',
  stopped: 'The session was stopped before the end.',
  reviewed: 'Reviewed by the auditor.',
  superseded: 'A later revision replaced this one; it is kept for the record.',
};

/** Statuses from which a signed order can still be amended (the server's rule). */

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
