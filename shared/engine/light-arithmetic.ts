// Definitions of laser arithmetic; no source beyond geometry and the units themselves.

const umPerCm = 10_000;
const mjPerJ = 1000;

export const lightArithmeticSource =
  'definition: area of a circle π d²/4; irradiance = power ÷ area; fluence = irradiance × time; energy = power × time';

export function spotAreaCm2(spotDiameterUm: number): number {
  const diameterCm = spotDiameterUm / umPerCm;
  return (Math.PI * diameterCm * diameterCm) / 4;
}

export function spotDiameterUmFromArea(areaCm2: number): number {
  return Math.sqrt((4 * areaCm2) / Math.PI) * umPerCm;
}

/** mW/cm² × s = mJ/cm², hence ÷ 1000 for J/cm². */
export function fluenceJPerCm2(irradianceMwPerCm2: number, exposureS: number): number {
  return (irradianceMwPerCm2 * exposureS) / mjPerJ;
}

export function exposureSForFluence(fluenceJPerCm2: number, irradianceMwPerCm2: number): number {
  return (fluenceJPerCm2 * mjPerJ) / irradianceMwPerCm2;
}

/** mW × s = mJ, hence ÷ 1000 for J. */
export function energyJ(powerMw: number, exposureS: number): number {
  return (powerMw * exposureS) / mjPerJ;
}

/** UV on-time stretched by a pulsed cycle: on-time × (on + off) ÷ on. */
export function pulsedElapsedS(
  onTimeS: number,
  pulse: { onS: number; offS: number } | null,
): number {
  return pulse === null ? onTimeS : (onTimeS * (pulse.onS + pulse.offS)) / pulse.onS;
}

/** Light on-time of a pulsed cycle: elapsed × on ÷ (on + off), the inverse of `pulsedElapsedS`. */
export function pulsedOnS(elapsedS: number, pulse: { onS: number; offS: number } | null): number {
  return pulse === null ? elapsedS : (elapsedS * pulse.onS) / (pulse.onS + pulse.offS);
}
