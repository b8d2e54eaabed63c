/**
 * The drawn volume must deliver the dose: rounding the volume to the syringe's graduation may
 * move the dose in the syringe by at most this much. An engine rule, the same for every
 * protocol (common practice: a rounding step must not change a dose by a clinically noticeable
 * amount); the graduation itself is a protocol value.
 */
export const maxDrawnDoseShiftPct = 1;

/** Percent by which the dose in the drawn volume differs from the prescribed dose (signed). */
export function drawnDoseShiftPct(drawnDoseMg: number, doseMg: number): number {
  return ((drawnDoseMg - doseMg) / doseMg) * 100;
}

/**
 * The largest shift rounding to `graduationMl` can cause for a volume of at least
 * `smallestVolumeMl`: half a graduation over the smallest volume.
 */
export function worstDrawnDoseShiftPct(graduationMl: number, smallestVolumeMl: number): number {
  return (graduationMl / 2 / smallestVolumeMl) * 100;
}

/** Drug volume holding a dose: mg ÷ mg/mL = mL. */
export function drugVolumeMlForDose(doseMg: number, concentrationMgPerMl: number): number {
  return doseMg / concentrationMgPerMl;
}

/** Dose held in a drug volume: mL × mg/mL = mg. */
export function drugMgInVolume(volumeMl: number, concentrationMgPerMl: number): number {
  return volumeMl * concentrationMgPerMl;
}
