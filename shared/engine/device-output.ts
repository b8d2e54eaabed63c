import { spotAreaCm2 } from './light-arithmetic';
import { withinPct } from './tolerance';

/**
 * The treatment device's arithmetic: an output check's verdict, the lens factor's direction, and
 * the irradiance a session's delivered fluence is worked out from. Fluence itself is
 * `fluenceJPerCm2` (light-arithmetic.ts); nothing here computes it a second way.
 */

/** How far a reading lies from the value set, in percent of the value set (negative: under). */
export function differencePct(actual: number, expected: number): number {
  return ((actual - expected) / expected) * 100;
}

/** An output check passes when the meter's reading lies within the tolerance of the value set. */
export function outputCheckPasses(
  setValue: number,
  measuredValue: number,
  tolerancePct: number,
): boolean {
  return withinPct(measuredValue, setValue, tolerancePct);
}

/**
 * The contact lens's laser-spot factor: device spot = retinal spot ÷ factor, so the retinal spot
 * a device setting gives is device spot × factor [common practice].
 */
export function deviceSpotUmForRetinalSpot(retinalSpotUm: number, laserSpotFactor: number): number {
  return retinalSpotUm / laserSpotFactor;
}

export function retinalSpotUmForDeviceSpot(deviceSpotUm: number, laserSpotFactor: number): number {
  return deviceSpotUm * laserSpotFactor;
}

/**
 * The retinal spot a laser's spot setting gives: a laser that takes the retinal spot gives what
 * it is set to; one that takes the device spot gives the setting × the lens's factor.
 */
export function retinalSpotUmFromSetting(
  spotSetUm: number,
  laserSpotFactor: number,
  laserSpotSetting: 'retinal-spot' | 'device-spot',
): number {
  return laserSpotSetting === 'retinal-spot'
    ? spotSetUm
    : retinalSpotUmForDeviceSpot(spotSetUm, laserSpotFactor);
}

/** PDT's nominal irradiance on the retina: the power set over the retinal spot's area (mW ÷ cm²). */
export function nominalIrradianceMwPerCm2(powerSetMw: number, retinalSpotUm: number): number {
  return powerSetMw / spotAreaCm2(retinalSpotUm);
}

/** A device's settable range: a figure inside it, edges included (no noise slack: a range is a hard limit). */
export function withinRange(value: number, range: { min: number; max: number }): boolean {
  return value >= range.min && value <= range.max;
}
