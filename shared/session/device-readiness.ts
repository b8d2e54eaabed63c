import { DateTime } from 'luxon';
import { differencePct, outputCheckPasses, withinRange } from '../engine/device-output';
import type { DeviceBlock, DeviceKind, DeviceSetting, DeviceStatus } from '../schemas/devices';

/** What the readiness rule reads of a device. */
export interface DeviceFacts {
  id: number;
  name: string;
  kind: DeviceKind;
  status: DeviceStatus;
  outOfServiceReason: string | null;
  serviceDueOn: string;
  powerRangeMw: { min: number; max: number } | null;
  spotRangeUm: { min: number; max: number } | null;
  irradianceRangeMwPerCm2: { min: number; max: number } | null;
}

/** What it reads of the device's latest output check. */
export interface CheckFacts {
  id: number;
  checkedAt: string;
  setValue: number;
  measuredValue: number;
  passed: boolean;
}

/**
 * How long an output check counts: the unit's calendar day it was made on (the default), or a
 * number of hours (OUTPUT_CHECK_VALID_H).
 */
export type CheckValidity = { kind: 'unit-day' } | { kind: 'hours'; hours: number };

const unitDay = (ms: number, zone: string) => DateTime.fromMillis(ms, { zone }).toISODate()!;

/**
 * Why a device cannot start a session at `nowMs`, each reason worded for the nurse; empty when it
 * can. `tolerancePct`, when given, re-judges the check by the order's protocol (a check judged
 * by a looser tolerance elsewhere does not pass a stricter protocol).
 */
export function deviceBlocks(
  device: DeviceFacts,
  lastCheck: CheckFacts | null,
  options: {
    nowMs: number;
    unitTimeZone: string;
    validity: CheckValidity;
    tolerancePct?: number;
    expectedKind?: DeviceKind;
  },
): DeviceBlock[] {
  const blocks: DeviceBlock[] = [];
  const today = unitDay(options.nowMs, options.unitTimeZone);
  if (options.expectedKind !== undefined && device.kind !== options.expectedKind)
    blocks.push({
      kind: 'out-of-service',
      message: `${device.name} is a ${device.kind === 'uv' ? 'UV source' : 'laser'}; this treatment needs a ${options.expectedKind === 'uv' ? 'UV source' : 'laser'}.`,
    });
  if (device.status === 'out-of-service')
    blocks.push({
      kind: 'out-of-service',
      message: `${device.name} is out of service: ${device.outOfServiceReason ?? 'no reason given'}.`,
    });
  if (device.serviceDueOn < today)
    blocks.push({
      kind: 'service-overdue',
      message: `${device.name} was due for service on ${device.serviceDueOn}.`,
    });
  if (lastCheck === null) {
    blocks.push({ kind: 'no-check', message: `${device.name} has no output check on record.` });
    return blocks;
  }
  const checkedMs = Date.parse(lastCheck.checkedAt);
  const fresh =
    options.validity.kind === 'unit-day'
      ? unitDay(checkedMs, options.unitTimeZone) === today
      : options.nowMs - checkedMs <= options.validity.hours * 3_600_000;
  if (!fresh)
    blocks.push({
      kind: 'check-stale',
      message:
        options.validity.kind === 'unit-day'
          ? `${device.name}'s last output check is from ${unitDay(checkedMs, options.unitTimeZone)}, not today.`
          : `${device.name}'s last output check is older than ${options.validity.hours} h.`,
    });
  const passes =
    lastCheck.passed &&
    (options.tolerancePct === undefined ||
      outputCheckPasses(lastCheck.setValue, lastCheck.measuredValue, options.tolerancePct));
  if (!passes)
    blocks.push({
      kind: 'check-failed',
      message: `${device.name}'s last output check failed: it read ${lastCheck.measuredValue} against ${lastCheck.setValue} set (${differencePct(lastCheck.measuredValue, lastCheck.setValue).toFixed(1)} %${options.tolerancePct !== undefined ? `, tolerance ± ${options.tolerancePct} %` : ''}).`,
    });
  return blocks;
}

/** A setting outside the device's own range: the field, its value and the range, or null when all fit. */
export function settingOutsideRange(
  device: DeviceFacts,
  setting: DeviceSetting,
): { path: string; message: string } | null {
  const checks: [keyof DeviceSetting, number | undefined, DeviceFacts['powerRangeMw'], string][] = [
    ['powerSetMw', setting.powerSetMw, device.powerRangeMw, 'mW'],
    ['spotSetUm', setting.spotSetUm, device.spotRangeUm, 'µm'],
    [
      'irradianceSetMwPerCm2',
      setting.irradianceSetMwPerCm2,
      device.irradianceRangeMwPerCm2,
      'mW/cm²',
    ],
  ];
  for (const [field, value, range, unit] of checks) {
    if (value === undefined) continue;
    if (range === null)
      return {
        path: `device.${field}`,
        message: `device.${field} cannot be set on ${device.name} (a ${device.kind === 'uv' ? 'UV source' : 'laser'})`,
      };
    if (!withinRange(value, range))
      return {
        path: `device.${field}`,
        message: `device.${field} must be from ${range.min} to ${range.max} ${unit} on ${device.name}; ${value} ${unit} was given`,
      };
  }
  return null;
}
