import type { DeviceSetting } from '../../shared/schemas/devices';
import {
  deviceBlocks,
  settingOutsideRange,
  type CheckValidity,
} from '../../shared/session/device-readiness';
import type { DeviceRecord, SessionEventInput } from '../../shared/session/session-events';
import { checkFacts, deviceFacts, type DeviceRepository } from '../devices/repository';

/** A session start the device rules refuse: the rule, what to tell the nurse, the field and the status. */
export interface DeviceStartRefusal {
  rule: string;
  message: string;
  field: { path: string; message: string };
  status: number;
}

type Start = Extract<SessionEventInput, { type: 'session-started' }>;

const refusal = (
  rule: string,
  message: string,
  path: string,
  fieldMessage: string,
  status = 422,
): { refusal: DeviceStartRefusal } => ({
  refusal: { rule, message, field: { path, message: fieldMessage }, status },
});

/**
 * The device rules of a session start, read before the start is stored: the device exists, is of
 * the kind the treatment needs, is in service, within its service date, and its last output
 * check is from today (or the configured hours) and passes the order's protocol; the settings
 * given are the kind's and lie inside the device's ranges. Every start names its device, whatever
 * the protocol version (an older version without deviceChecks holds the check to the default
 * tolerance), and a laser start names its contact lens: the order's, or one chosen at the start
 * whose laser-spot factor is the plan's. Returns what the stored start records, or the refusal.
 */
export async function deviceStartVerdict(
  devices: DeviceRepository,
  orderId: number,
  input: Start,
  options: { nowMs: number; unitTimeZone: string; validity: CheckValidity },
): Promise<{ refusal: DeviceStartRefusal } | { record: DeviceRecord | null }> {
  const order = await devices.orderProtocol(orderId);
  // An unknown order is refused by the transaction with its own 404.
  if (!order) return { record: null };
  const { definition } = order;
  const checks = definition.deviceChecks;
  const setting: DeviceSetting | undefined = input.device;
  if (!setting)
    return refusal(
      'device_required',
      `The session cannot start without its device: choose the ${definition.kind === 'pdt' ? 'laser' : 'UV source'} and enter what is set on it.`,
      'device',
      `device is required for ${order.key} v${order.version} (deviceId and the settings)`,
    );
  const row = await devices.findById(setting.deviceId);
  if (!row)
    return refusal(
      'device_unknown',
      `There is no device ${setting.deviceId} on the register.`,
      'device.deviceId',
      'device.deviceId must be a device on the register',
    );
  const device = deviceFacts(row);
  const last = await devices.lastCheck(device.id);
  const lastCheck = last ? checkFacts(last) : null;
  const kind = definition.kind === 'pdt' ? 'laser' : 'uv';
  const blocks = deviceBlocks(device, lastCheck, {
    ...options,
    expectedKind: kind,
    tolerancePct: checks?.outputCheckTolerancePct,
  });
  if (blocks.length > 0)
    return refusal(
      `device_${blocks[0]!.kind.replaceAll('-', '_')}`,
      `${device.name} cannot start this session: ${blocks.map((b) => b.message).join(' ')}`,
      'device.deviceId',
      `device.deviceId must name a device in service, within its service date, with a passing output check from ${options.validity.kind === 'unit-day' ? 'today' : `the last ${options.validity.hours} h`}`,
    );

  const needed: (keyof DeviceSetting)[] =
    kind === 'laser' ? ['powerSetMw', 'spotSetUm'] : ['irradianceSetMwPerCm2'];
  const missing = needed.find((field) => setting[field] === undefined);
  if (missing)
    return refusal(
      'device_setting_missing',
      `Enter what is set on ${device.name}: ${needed.map((f) => `device.${f}`).join(' and ')}.`,
      `device.${missing}`,
      `device.${missing} is required for a ${kind === 'laser' ? 'laser' : 'UV source'}`,
      400,
    );
  const outside = settingOutsideRange(device, setting);
  if (outside)
    return refusal(
      'device_range',
      `The setting is outside what ${device.name} can be set to; check the unit (mW, µm, mW/cm²).`,
      outside.path,
      outside.message,
    );
  if (definition.light.pulse !== null && !row.pulsedAvailable)
    return refusal(
      'device_not_pulsed',
      `${device.name} cannot run the pulsed cycle this protocol needs.`,
      'device.deviceId',
      'device.deviceId must name a device that can pulse',
    );

  const lensVerdict = await startLens(devices, order.inputs, setting, kind);
  if ('refusal' in lensVerdict) return lensVerdict;
  const { lens } = lensVerdict;
  const fromCheck =
    lastCheck?.quantity === 'irradiance' && lastCheck.setValue === setting.irradianceSetMwPerCm2
      ? lastCheck.measuredValue
      : null;
  const measured = setting.irradianceMeasuredMwPerCm2 ?? fromCheck;
  return {
    record: {
      deviceId: device.id,
      name: device.name,
      kind: device.kind,
      serialNumber: device.serialNumber ?? row.serialNumber,
      outputCheckId: lastCheck!.id,
      outputCheckedAt: lastCheck!.checkedAt,
      measuredIrradianceMwPerCm2: kind === 'uv' ? measured : null,
      measuredFrom:
        kind !== 'uv' || measured === null
          ? null
          : setting.irradianceMeasuredMwPerCm2 !== undefined
            ? 'entered'
            : 'output-check',
      lensId: lens?.id ?? null,
      lensName: lens?.name ?? null,
      laserSpotFactor: lens?.laserSpotFactor ?? null,
      // Versions before deviceChecks plan the laser's spot as the device spot (retinal ÷ factor).
      laserSpotSetting: kind === 'laser' ? (checks?.laserSpotSetting ?? 'device-spot') : null,
    },
  };
}

type StartLens = { id: number; name: string; laserSpotFactor: number } | null;

/**
 * The contact lens of a laser start. The order's lens (picked from the register when it was
 * signed) is the one; an order whose factor was typed needs the lens named at the start, in use on
 * the register and with the plan's laser-spot factor, since the spot set on the laser was worked
 * out with that factor. A UV source takes no lens.
 */
async function startLens(
  devices: DeviceRepository,
  inputs: { lensId?: number; lensMagnification?: number },
  setting: DeviceSetting,
  kind: 'laser' | 'uv',
): Promise<{ refusal: DeviceStartRefusal } | { lens: StartLens }> {
  if (kind === 'uv') {
    if (setting.lensId === undefined) return { lens: null };
    return refusal(
      'device_lens_not_laser',
      'A UV source takes no contact lens from the lens register.',
      'device.lensId',
      'device.lensId must be left out for a UV source',
      400,
    );
  }
  if (inputs.lensId !== undefined) {
    if (setting.lensId !== undefined && setting.lensId !== inputs.lensId)
      return refusal(
        'device_lens_mismatch',
        `The order's plan was worked out with lens ${inputs.lensId}; use that lens, or correct the order.`,
        'device.lensId',
        `device.lensId must be ${inputs.lensId}, the order's lens (or be left out)`,
      );
    const ordered = await devices.findLens(inputs.lensId);
    if (!ordered)
      return refusal(
        'device_lens_unknown',
        `There is no lens ${inputs.lensId} on the register.`,
        'device.lensId',
        'device.lensId must name a lens on the register',
      );
    return { lens: lensFacts(ordered) };
  }
  const factor = inputs.lensMagnification;
  if (setting.lensId === undefined)
    return refusal(
      'device_lens_required',
      'Name the contact lens on the eye: the order gives only its factor.',
      'device.lensId',
      `device.lensId is required: a lens in use whose laser-spot factor is ${factor ?? "the order's"}`,
      400,
    );
  const chosen = await devices.findLens(setting.lensId);
  if (!chosen || !chosen.active)
    return refusal(
      'device_lens_unknown',
      `There is no lens ${setting.lensId} in use on the register.`,
      'device.lensId',
      'device.lensId must name a lens in use (Lenses page)',
    );
  if (factor !== undefined && chosen.laserSpotFactor !== factor)
    return refusal(
      'device_lens_factor',
      `${chosen.name} has a laser-spot factor of ${chosen.laserSpotFactor}; the plan's spot was worked out with ${factor}. Use a lens with that factor, or correct the order.`,
      'device.lensId',
      `device.lensId must name a lens whose laser-spot factor is ${factor} (${chosen.name}: ${chosen.laserSpotFactor})`,
    );
  return { lens: lensFacts(chosen) };
}

const lensFacts = (row: { id: number; name: string; laserSpotFactor: number }) => ({
  id: row.id,
  name: row.name,
  laserSpotFactor: row.laserSpotFactor,
});
