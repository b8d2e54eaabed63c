import { beyondUseState } from '../orders/beyond-use';
import { doseTimes, type DoseTiming } from './dose-times';

/** The product figures a vial is planned with; all come from the order's protocol version. */
export interface VialFigures {
  vialContentMg: number;
  concentrationMgPerMl: number;
  /** What can really be drawn from one reconstituted vial (the reconstituted volume when unstated). */
  withdrawableVolumeMlPerVial: number;
  beyondUseH: number;
}

export interface PlannedDose {
  orderId: number;
  label: string;
  /** The slot's time: when the light starts. */
  slotStartsAt: Date;
  doseMg: number;
  /** The volume to draw, as the order's frozen plan rounded it to the syringe graduation. */
  drugVolumeMl: number;
  timing: DoseTiming;
  vial: VialFigures;
}

export interface VialPlanStep {
  orderId: number;
  label: string;
  readyBy: Date;
  doseMg: number;
  drugVolumeMl: number;
  /** Vial numbers (1, 2, …) the dose is drawn from. */
  vials: number[];
  /** True when the dose comes from a vial opened for an earlier patient. */
  fromSharedVial: boolean;
}

export interface PlannedVial {
  number: number;
  /** Reconstitute no later than this (the first patient's ready-by time)… */
  reconstituteBy: Date;
  /** …and no earlier than this (so it is still usable when its last patient's infusion ends). */
  reconstituteNotBefore: Date;
  orderIds: number[];
  drawnMl: number;
  /** Reconstituted drug left in the vial and discarded, in mL and mg. */
  leftOverMl: number;
  leftOverMg: number;
}

export interface VialPlan {
  steps: VialPlanStep[];
  vials: PlannedVial[];
  totalDoseMg: number;
  vialsUnshared: number;
  vialsPlanned: number;
  vialsSaved: number;
  sharingAllowed: boolean;
}

const sameFigures = (a: VialFigures, b: VialFigures) =>
  a.vialContentMg === b.vialContentMg &&
  a.concentrationMgPerMl === b.concentrationMgPerMl &&
  a.withdrawableVolumeMlPerVial === b.withdrawableVolumeMlPerVial &&
  a.beyondUseH === b.beyondUseH;

const round = (value: number, places = 2) => Number(value.toFixed(places));
// Volumes come rounded to a 0.01 mL graduation; sums are compared within a hair of it.
const epsilonMl = 1e-9;

/** Vials one dose needs on its own: the same rule as the dose plan (ceil of volume ÷ withdrawable volume). */
export function vialsForDose(drugVolumeMl: number, withdrawableMlPerVial: number): number {
  return Math.ceil(drugVolumeMl / withdrawableMlPerVial - epsilonMl);
}

/**
 * The vials a list needs and the order to prepare them in (by ready-by time). Without sharing,
 * each dose opens its own vials. With sharing (only where the unit's policy allows it), a dose is
 * drawn whole from the vial last opened when what is left in it covers the dose, the product
 * figures are the same, and the vial — made up by its first patient's ready-by time — would still
 * be usable (not past, nor in the closing window of shared/orders/beyond-use.ts) when this
 * patient's infusion ends. A dose is never split between a shared vial and a new one.
 */
export function planVials(doses: readonly PlannedDose[], sharingAllowed: boolean): VialPlan {
  const ordered = doses
    .map((dose) => ({ dose, times: doseTimes(dose.slotStartsAt, dose.timing) }))
    .sort(
      (a, b) =>
        a.times.readyBy.getTime() - b.times.readyBy.getTime() || a.dose.orderId - b.dose.orderId,
    );

  const vials: (PlannedVial & { figures: VialFigures; remainingMl: number })[] = [];
  const steps: VialPlanStep[] = [];
  let vialsUnshared = 0;

  for (const { dose, times } of ordered) {
    const own = vialsForDose(dose.drugVolumeMl, dose.vial.withdrawableVolumeMlPerVial);
    vialsUnshared += own;
    const open = vials.at(-1);
    const shareable =
      sharingAllowed &&
      open !== undefined &&
      open.orderIds.length > 0 &&
      sameFigures(open.figures, dose.vial) &&
      open.remainingMl + epsilonMl >= dose.drugVolumeMl &&
      beyondUseState(
        open.reconstituteBy.getTime() +
          dose.vial.beyondUseH * 3_600_000 -
          times.infusionEndAt.getTime(),
      ) === 'usable';
    if (shareable && open) {
      open.orderIds.push(dose.orderId);
      open.drawnMl = round(open.drawnMl + dose.drugVolumeMl);
      open.remainingMl = round(open.remainingMl - dose.drugVolumeMl);
      open.reconstituteNotBefore = times.earliestReconstitutionAt;
      steps.push({ ...stepOf(dose, times.readyBy), vials: [open.number], fromSharedVial: true });
      continue;
    }
    const numbers: number[] = [];
    let left = dose.drugVolumeMl;
    for (let i = 0; i < own; i += 1) {
      const drawn = Math.min(left, dose.vial.withdrawableVolumeMlPerVial);
      left = round(left - drawn);
      const number = vials.length + 1;
      numbers.push(number);
      vials.push({
        number,
        reconstituteBy: times.readyBy,
        reconstituteNotBefore: times.earliestReconstitutionAt,
        orderIds: [dose.orderId],
        drawnMl: round(drawn),
        leftOverMl: 0,
        leftOverMg: 0,
        figures: dose.vial,
        remainingMl: round(dose.vial.withdrawableVolumeMlPerVial - drawn),
      });
    }
    steps.push({ ...stepOf(dose, times.readyBy), vials: numbers, fromSharedVial: false });
  }

  const planned: PlannedVial[] = vials.map(({ figures, remainingMl: _remaining, ...vial }) => {
    const leftOverMg = round(figures.vialContentMg - vial.drawnMl * figures.concentrationMgPerMl);
    return {
      ...vial,
      leftOverMg,
      leftOverMl: round(leftOverMg / figures.concentrationMgPerMl),
    };
  });
  return {
    steps,
    vials: planned,
    totalDoseMg: round(ordered.reduce((sum, { dose }) => sum + dose.doseMg, 0)),
    vialsUnshared,
    vialsPlanned: planned.length,
    vialsSaved: vialsUnshared - planned.length,
    sharingAllowed,
  };
}

function stepOf(dose: PlannedDose, readyBy: Date) {
  return {
    orderId: dose.orderId,
    label: dose.label,
    readyBy,
    doseMg: dose.doseMg,
    drugVolumeMl: dose.drugVolumeMl,
  };
}

/** The words every screen that shows or changes vial sharing quotes. */
export const vialSharingCaution =
  'One vial serves more than one patient only where the unit’s written policy allows it: prepared aseptically, every dose drawn and infused within the beyond-use time of the vial. The product labelling and local policy prevail over this plan.';
