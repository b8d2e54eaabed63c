/**
 * Milligrams of drug in a volume taken from the infusion: the dose is diluted evenly to the final
 * volume, so the share infused is volume ÷ final volume of the dose (a proportion, no source needed).
 * Throws RangeError on a volume outside 0..final volume or an unusable dose.
 */
export function doseInInfusedVolumeMg(
  volumeInfusedMl: number,
  doseMg: number,
  finalVolumeMl: number,
): number {
  if (!Number.isFinite(finalVolumeMl) || finalVolumeMl <= 0)
    throw new RangeError(`finalVolumeMl must be a number greater than 0 mL (got ${finalVolumeMl})`);
  if (!Number.isFinite(volumeInfusedMl) || volumeInfusedMl < 0 || volumeInfusedMl > finalVolumeMl) {
    throw new RangeError(
      `volumeInfusedMl must be a number from 0 to ${finalVolumeMl} mL (got ${volumeInfusedMl})`,
    );
  }
  if (!Number.isFinite(doseMg) || doseMg < 0)
    throw new RangeError(`doseMg must be a number of at least 0 mg (got ${doseMg})`);
  return (doseMg * volumeInfusedMl) / finalVolumeMl;
}
