// Corneal UVA arithmetic for cross-linking. Literature thresholds live here with their
// sources; site policy (minimum thickness, intervals, tolerances) lives in the protocol.

/**
 * Spoerl E, Mrochen M, Sliney D, Trokel S, Seiler T. Cornea 2007;26:385–389: 3 mW/cm² at the
 * surface of a riboflavin-saturated 400 µm cornea leaves 0.18 mW/cm² at the endothelium.
 */
export const spoerlSurfaceMwPerCm2 = 3;
export const spoerlEndothelialMwPerCm2 = 0.18;
export const spoerlDepthCm = 0.04;

/** Natural-log attenuation coefficient from Spoerl's figures (our own arithmetic): ≈ 70.3 cm⁻¹. */
export const stromaAttenuationPerCm =
  Math.log(spoerlSurfaceMwPerCm2 / spoerlEndothelialMwPerCm2) / spoerlDepthCm;

export const attenuationSource =
  'Spoerl E, Mrochen M, Sliney D, Trokel S, Seiler T. Cornea 2007;26:385–389 (3 → 0.18 mW/cm² across 400 µm of riboflavin-saturated stroma) with our own Beer–Lambert arithmetic';

export const endothelialEstimateLabel = 'estimate — ignores riboflavin bleaching';

/** Endothelial damage threshold for irradiance (Spoerl E et al. Cornea 2007;26:385–389). */
export const endothelialIrradianceLimitMwPerCm2 = 0.35;

/** Endothelial cytotoxic dose (Wollensak G et al. J Cataract Refract Surg 2003;29:1786–1790). */
export const endothelialCytotoxicDoseJPerCm2 = 0.65;

/**
 * Above about this irradiance Bunsen–Roscoe reciprocity is reported to fail (Wernli J,
 * Schumacher S, Spoerl E, Mrochen M. Invest Ophthalmol Vis Sci 2013;54:1176–1180); the figure
 * itself is from memory, so the engine warns and never forbids.
 */
export const reciprocityLimitMwPerCm2 = 45;

/** Beer–Lambert: I(d) = I0 · e^(−α·d), d in cm. */
export function irradianceAtDepthMwPerCm2(surfaceMwPerCm2: number, depthUm: number): number {
  return surfaceMwPerCm2 * Math.exp(-stromaAttenuationPerCm * (depthUm / 10_000));
}

/**
 * The stroma is too thin for UV when a reading is under the protocol's minimum; a reading exactly
 * at the minimum is enough (common practice: the minimum is the least thickness allowed).
 */
export function belowMinimumThickness(thicknessUm: number, minimumUm: number): boolean {
  return thicknessUm < minimumUm;
}
