import { nominalIrradianceMwPerCm2, retinalSpotUmFromSetting } from '../engine/device-output';
import type { ProtocolVersion } from '../protocol/protocol-schema';
import type { DosePlan } from '../schemas/calculation';
import type { DeviceSetting } from '../schemas/devices';
import type { DeviceRecord } from './session-events';

/** Where the irradiance behind the delivered fluence comes from. */
export type FluenceBasis = 'measured' | 'nominal' | 'planned';

/** The device part of the dose record: what was used and set, and the irradiance the fluence is worked from. */
export interface DeviceUsed {
  device: {
    id: number;
    name: string;
    kind: 'laser' | 'uv';
    serialNumber: string;
    outputCheckId: number;
  } | null;
  lens: { id: number | null; name: string | null; laserSpotFactor: number } | null;
  powerSetMw: number | null;
  spotSetUm: number | null;
  /** PDT: the retinal spot the spot setting gives through the lens (the plan's spot when set right). */
  retinalSpotFromSettingUm: number | null;
  irradianceSetMwPerCm2: number | null;
  measuredIrradianceMwPerCm2: number | null;
  /**
   * The irradiance the delivered fluence is worked from: CXL the measured irradiance (else the
   * one set), PDT the power set over the retinal spot's area ("nominal"); the plan's when the
   * session named no device.
   */
  fluenceIrradianceMwPerCm2: number | null;
  fluenceBasis: FluenceBasis;
}

export function deviceUsedOf(
  protocol: ProtocolVersion,
  plan: DosePlan,
  start: { device?: DeviceSetting; deviceRecord?: DeviceRecord } | null,
): DeviceUsed {
  const setting = start?.device;
  const record = start?.deviceRecord;
  const planned: DeviceUsed = {
    device: null,
    lens: null,
    powerSetMw: null,
    spotSetUm: null,
    retinalSpotFromSettingUm: null,
    irradianceSetMwPerCm2: null,
    measuredIrradianceMwPerCm2: null,
    fluenceIrradianceMwPerCm2: plan.irradianceMwPerCm2,
    fluenceBasis: 'planned',
  };
  if (!setting || !record) return planned;
  const used: DeviceUsed = {
    ...planned,
    device: {
      id: record.deviceId,
      name: record.name,
      kind: record.kind,
      serialNumber: record.serialNumber,
      outputCheckId: record.outputCheckId,
    },
    lens:
      record.laserSpotFactor === null
        ? null
        : { id: record.lensId, name: record.lensName, laserSpotFactor: record.laserSpotFactor },
    powerSetMw: setting.powerSetMw ?? null,
    spotSetUm: setting.spotSetUm ?? null,
    irradianceSetMwPerCm2: setting.irradianceSetMwPerCm2 ?? null,
    measuredIrradianceMwPerCm2: record.measuredIrradianceMwPerCm2,
  };
  if (protocol.kind === 'pdt') {
    if (used.powerSetMw === null || used.spotSetUm === null || record.laserSpotFactor === null)
      return used;
    const retinalUm = retinalSpotUmFromSetting(
      used.spotSetUm,
      record.laserSpotFactor,
      record.laserSpotSetting ?? 'device-spot',
    );
    return {
      ...used,
      retinalSpotFromSettingUm: retinalUm,
      fluenceIrradianceMwPerCm2: nominalIrradianceMwPerCm2(used.powerSetMw, retinalUm),
      fluenceBasis: 'nominal',
    };
  }
  if (used.measuredIrradianceMwPerCm2 !== null)
    return {
      ...used,
      fluenceIrradianceMwPerCm2: used.measuredIrradianceMwPerCm2,
      fluenceBasis: 'measured',
    };
  if (used.irradianceSetMwPerCm2 !== null)
    return {
      ...used,
      fluenceIrradianceMwPerCm2: used.irradianceSetMwPerCm2,
      fluenceBasis: 'nominal',
    };
  return used;
}
