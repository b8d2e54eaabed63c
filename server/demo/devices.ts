import { DateTime } from 'luxon';
import type { DataSource } from 'typeorm';
import { differencePct, outputCheckPasses } from '../../shared/engine/device-output';
import type { ProtocolVersion as ProtocolDefinition } from '../../shared/protocol/protocol-schema';
import type { DosePlan } from '../../shared/schemas/calculation';
import type { DeviceInput } from '../../shared/schemas/devices';
import type { DeviceRecord } from '../../shared/session/session-events';
import { Device, OutputCheck } from '../db/entities/device';
import { asTransaction } from '../db/unit-of-work';
import { createDeviceRepository } from '../devices/repository';
import { createUserRepository } from '../people/repository';
import { demoDomain } from './seed';
import { newestApprovedVersion } from './scenario';

/**
 * The demo unit's treatment devices: two lasers and two UV sources (invented names, serials and
 * rooms), the three lenses the PDT protocol file cites (factors from memory), and a month of
 * daily output checks: laser B drifts down over the month, UV source 1 failed one check and was
 * re-checked the next day. Each day the seed runs, a device in use gets today's check if it has
 * none, so the demo's sessions can start.
 */
const demoDevices: (DeviceInput & {
  drift: (daysAgo: number) => number;
  failedDaysAgo?: number;
})[] = [
  {
    name: 'Laser A, laser room (demo)',
    kind: 'laser',
    wavelengthNm: 689,
    serialNumber: 'MP-LAS-0117',
    location: 'Laser room, Marram Point (demo)',
    powerRangeMw: { min: 10, max: 450 },
    spotRangeUm: { min: 1000, max: 6400 },
    irradianceRangeMwPerCm2: null,
    pulsedAvailable: false,
    serviceDueOn: '2027-09-30',
    status: 'in-use',
    outOfServiceReason: null,
    drift: () => 0.99,
  },
  {
    name: 'Laser B, day-case bay (demo)',
    kind: 'laser',
    wavelengthNm: 689,
    serialNumber: 'MP-LAS-0242',
    location: 'Day-case bay 2, Marram Point (demo)',
    powerRangeMw: { min: 10, max: 450 },
    spotRangeUm: { min: 1000, max: 6400 },
    irradianceRangeMwPerCm2: null,
    pulsedAvailable: false,
    serviceDueOn: '2027-03-31',
    status: 'in-use',
    outOfServiceReason: null,
    // A slow drift: from 1 % over to about 8 % under the value set over the month.
    drift: (daysAgo) => 0.92 + (0.09 * daysAgo) / 30,
  },
  {
    name: 'UV source 1, treatment room (demo)',
    kind: 'uv',
    wavelengthNm: 370,
    serialNumber: 'MP-UVA-0031',
    location: 'Treatment room 1, Marram Point (demo)',
    powerRangeMw: null,
    spotRangeUm: null,
    irradianceRangeMwPerCm2: { min: 3, max: 45 },
    pulsedAvailable: true,
    serviceDueOn: '2027-06-30',
    status: 'in-use',
    outOfServiceReason: null,
    drift: () => 1.02,
    // One failed check (the aperture was dusty): 14 % under, re-checked clean the next day.
    failedDaysAgo: 12,
  },
  {
    name: 'UV source 2, treatment room (demo)',
    kind: 'uv',
    wavelengthNm: 365,
    serialNumber: 'MP-UVA-0058',
    location: 'Treatment room 2, Marram Point (demo)',
    powerRangeMw: null,
    spotRangeUm: null,
    irradianceRangeMwPerCm2: { min: 3, max: 30 },
    pulsedAvailable: false,
    serviceDueOn: '2027-11-30',
    status: 'in-use',
    outOfServiceReason: null,
    drift: () => 0.97,
  },
];

const demoMeter = { laser: 'Power meter PM-7 (demo)', uv: 'UV meter UVM-2 (demo)' } as const;
const checkedAtHour = 8;
const checkDays = 30;

/** Adds the demo devices, lenses and checks that are missing. Returns how many rows it added. */
export async function seedDemoDevices(
  dataSource: DataSource,
  unitTimeZone: string,
): Promise<number> {
  const nurse = await createUserRepository(dataSource).findByEmail(`nurse@${demoDomain}`);
  const lead = await createUserRepository(dataSource).findByEmail(`admin@${demoDomain}`);
  if (!nurse || !lead) return 0;
  const devices = createDeviceRepository(dataSource);
  let added = 0;

  const pdt = await newestApprovedVersion(dataSource, 'pdt-standard');
  for (const lens of pdt.definition.deviceChecks?.lenses ?? []) {
    if (await devices.findLensByName(lens.name)) continue;
    await devices.createLens(
      {
        name: lens.name,
        laserSpotFactor: lens.laserSpotFactor,
        imageMagnification: lens.imageMagnification,
      },
      lead.id,
    );
    added++;
  }

  const today = DateTime.now().setZone(unitTimeZone).startOf('day');
  for (const { drift, failedDaysAgo, ...input } of demoDevices) {
    let device = await devices.findByName(input.name);
    const isNew = !device;
    if (!device) {
      device = await dataSource.transaction((m) =>
        devices.create(asTransaction(m), input, lead.id, new Date()),
      );
      added++;
    }
    const setValue = input.kind === 'laser' ? 57.7 : 3;
    const checkOn = async (daysAgo: number, factor: number, note: string | null) => {
      const measuredValue = Math.round(setValue * factor * 100) / 100;
      const tolerancePct =
        (input.kind === 'laser' ? pdt : await newestApprovedVersion(dataSource, 'cxl-standard'))
          .definition.deviceChecks?.outputCheckTolerancePct ?? 10;
      await dataSource.getRepository(OutputCheck).insert({
        deviceId: device!.id,
        checkedAt: today.minus({ days: daysAgo }).set({ hour: checkedAtHour }).toJSDate(),
        checkedById: nurse.id,
        quantity: input.kind === 'laser' ? 'power' : 'irradiance',
        setValue,
        measuredValue,
        meterIdentity: demoMeter[input.kind],
        meterCalibrationDueOn: '2027-08-31',
        tolerancePct,
        toleranceFrom: 'demo seed',
        differencePct: differencePct(measuredValue, setValue),
        passed: outputCheckPasses(setValue, measuredValue, tolerancePct),
        orderId: null,
        note,
      });
      added++;
    };
    if (isNew) {
      for (let daysAgo = checkDays; daysAgo >= 1; daysAgo--) {
        if (daysAgo === failedDaysAgo)
          await checkOn(
            daysAgo,
            0.86,
            'Read low; aperture dusty (demo). Cleaned; re-check tomorrow.',
          );
        else await checkOn(daysAgo, drift(daysAgo), null);
      }
    }
    const last = await devices.lastCheck(device.id);
    const checkedToday =
      last !== null &&
      DateTime.fromJSDate(last.checkedAt).setZone(unitTimeZone).hasSame(today, 'day');
    if (device.status === 'in-use' && !checkedToday) await checkOn(0, drift(0), null);
  }
  return added;
}

/**
 * The demo unit's lens of a laser-spot factor (the lenses the protocol file cites are on the
 * register), or null when none has it.
 */
export async function demoLensWithFactor(dataSource: DataSource, laserSpotFactor: number) {
  const [row] = await dataSource.query(
    'SELECT id, name, laser_spot_factor AS factor FROM lens WHERE active = 1 AND laser_spot_factor = ? ORDER BY id LIMIT 1',
    [laserSpotFactor],
  );
  return row
    ? { id: Number(row.id), name: String(row.name), laserSpotFactor: Number(row.factor) }
    : null;
}

/**
 * What a demo history session's start records about its device: the first demo device of the
 * kind, set to the plan's figures, with its latest check, and for a laser the demo lens of the
 * order's laser-spot factor. Null when the demo has no devices.
 */
export async function demoDeviceStart(
  dataSource: DataSource,
  definition: ProtocolDefinition,
  plan: DosePlan,
  lensMagnification: number | undefined,
): Promise<{ device: object; deviceRecord: DeviceRecord } | null> {
  const kind = definition.kind === 'pdt' ? 'laser' : 'uv';
  const device = await dataSource
    .getRepository(Device)
    .findOne({ where: { kind }, order: { id: 'ASC' } });
  if (!device) return null;
  const check = await createDeviceRepository(dataSource).lastCheck(device.id);
  if (!check) return null;
  const pdt = kind === 'laser';
  const lens =
    pdt && lensMagnification !== undefined
      ? await demoLensWithFactor(dataSource, lensMagnification)
      : null;
  return {
    device: pdt
      ? {
          deviceId: device.id,
          powerSetMw: plan.powerMw,
          spotSetUm: plan.deviceSpotDiameterUm,
          ...(lens ? { lensId: lens.id } : {}),
        }
      : { deviceId: device.id, irradianceSetMwPerCm2: plan.irradianceMwPerCm2 },
    deviceRecord: {
      deviceId: device.id,
      name: device.name,
      kind: device.kind,
      serialNumber: device.serialNumber,
      outputCheckId: check.id,
      outputCheckedAt: check.checkedAt.toISOString(),
      measuredIrradianceMwPerCm2: null,
      measuredFrom: null,
      lensId: lens?.id ?? null,
      lensName: lens?.name ?? null,
      laserSpotFactor: pdt ? (lens?.laserSpotFactor ?? lensMagnification ?? null) : null,
      laserSpotSetting: pdt ? (definition.deviceChecks?.laserSpotSetting ?? 'device-spot') : null,
    },
  };
}
