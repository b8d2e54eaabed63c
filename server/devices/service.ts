import { DateTime } from 'luxon';
import { differencePct, outputCheckPasses } from '../../shared/engine/device-output';
import type {
  DeviceChange,
  DeviceInput,
  DeviceKind,
  LensInput,
  OutputCheckInput,
} from '../../shared/schemas/devices';
import { deviceBlocks, type CheckValidity } from '../../shared/session/device-readiness';
import type { AuditRepository } from '../audit/repository';
import type { Clock } from '../clock';
import { isDuplicateKey } from '../db/errors';
import type { UnitOfWork } from '../db/unit-of-work';
import { AppError } from '../http/app-error';
import type { Actor } from '../orders/service';
import { checkFacts, deviceFacts, type DeviceRepository } from './repository';

const protocolKindFor: Record<DeviceKind, 'pdt' | 'cxl'> = { laser: 'pdt', uv: 'cxl' };

/** How many output checks a device's page lists (and charts). */
const checksShown = 120;

export function createDeviceService(deps: {
  unitOfWork: UnitOfWork;
  devices: DeviceRepository;
  audit: AuditRepository;
  clock: Clock;
  unitTimeZone: string;
  checkValidity: CheckValidity;
}) {
  const { devices, audit, unitOfWork } = deps;
  const nowMs = () => deps.clock.now().getTime();
  const today = () => DateTime.fromMillis(nowMs(), { zone: deps.unitTimeZone }).toISODate()!;

  async function deviceOr404(id: number) {
    const device = await devices.findById(id);
    if (!device) throw AppError.notFound(`There is no device ${id}.`);
    return device;
  }

  const duplicateName = (name: string) =>
    AppError.conflict('duplicate_name', `A device called "${name}" is on the register already.`);

  /**
   * The tolerance a check is judged by: the order's protocol's, when made for an order whose
   * version has one; otherwise the strictest of the approved versions for this kind of device,
   * so a check made on the Devices page never passes a device some protocol would fail.
   */
  async function toleranceFor(kind: DeviceKind, orderId: number | undefined) {
    if (orderId !== undefined) {
      const order = await devices.orderProtocol(orderId);
      if (!order) throw AppError.notFound(`There is no order ${orderId}.`);
      if (order.definition.kind !== protocolKindFor[kind])
        throw AppError.badRequest(`Order ${orderId} is not treated with a ${kind} device.`, [
          {
            path: 'orderId',
            message: `orderId must be a ${protocolKindFor[kind]} order for a ${kind === 'uv' ? 'UV source' : 'laser'}`,
          },
        ]);
      const pct = order.definition.deviceChecks?.outputCheckTolerancePct;
      if (pct !== undefined) return { pct, from: `${order.key} v${order.version}` };
    }
    const candidates = (await devices.approvedDeviceChecks()).filter(
      (v) => v.kind === protocolKindFor[kind] && v.deviceChecks !== undefined,
    );
    const strictest = candidates.sort(
      (a, b) => a.deviceChecks!.outputCheckTolerancePct - b.deviceChecks!.outputCheckTolerancePct,
    )[0];
    if (!strictest)
      throw AppError.conflict(
        'no_tolerance',
        `No approved ${protocolKindFor[kind].toUpperCase()} protocol version states an output-check tolerance (deviceChecks.outputCheckTolerancePct), so the check cannot be judged.`,
      );
    return {
      pct: strictest.deviceChecks!.outputCheckTolerancePct,
      from: `${strictest.key} v${strictest.version} (strictest approved)`,
    };
  }

  async function readiness(device: Awaited<ReturnType<typeof deviceOr404>>) {
    const last = await devices.lastCheck(device.id);
    const lastCheck = last ? checkFacts(last) : null;
    return {
      lastCheck,
      blocks: deviceBlocks(deviceFacts(device), lastCheck, {
        nowMs: nowMs(),
        unitTimeZone: deps.unitTimeZone,
        validity: deps.checkValidity,
      }),
    };
  }

  return {
    async list() {
      const rows = await devices.list();
      return Promise.all(rows.map(async (d) => ({ ...deviceFacts(d), ...(await readiness(d)) })));
    },

    async detail(id: number) {
      const device = await deviceOr404(id);
      const [ready, checks, versions] = await Promise.all([
        readiness(device),
        devices.checksOf(id, checksShown),
        devices.versions(id),
      ]);
      return {
        device: { ...deviceFacts(device), ...ready },
        checks: checks.map(checkFacts),
        versions: versions.map((v) => ({
          version: v.version,
          changedAt: v.changedAt.toISOString(),
          changedByName: v.changedBy?.displayName ?? null,
          snapshot: v.snapshot,
        })),
      };
    },

    async create(actor: Actor, input: DeviceInput) {
      try {
        const saved = await unitOfWork((tx) =>
          devices.create(tx, input, actor.id, deps.clock.now()),
        );
        await audit.append({
          actorUserId: actor.id,
          action: 'device.added',
          entityType: 'device',
          entityId: saved.id,
          ipAddress: actor.ipAddress,
          details: { name: saved.name, kind: saved.kind, serialNumber: saved.serialNumber },
        });
        return deviceFacts(saved);
      } catch (error) {
        if (isDuplicateKey(error)) throw duplicateName(input.name);
        throw error;
      }
    },

    async update(actor: Actor, id: number, change: DeviceChange) {
      const before = await deviceOr404(id);
      if (before.kind !== change.device.kind)
        throw AppError.badRequest('A device keeps its kind; add the other kind as a new device.', [
          { path: 'device.kind', message: `device.kind must stay ${before.kind}` },
        ]);
      let saved;
      try {
        saved = await unitOfWork((tx) =>
          devices.update(
            tx,
            id,
            change.version,
            change.device,
            change.reason,
            actor.id,
            deps.clock.now(),
          ),
        );
      } catch (error) {
        if (isDuplicateKey(error)) throw duplicateName(change.device.name);
        throw error;
      }
      if (!saved)
        throw AppError.conflict(
          'stale_version',
          `Device ${id} was changed by someone else (it is at version ${before.version}); reload it and make your change again.`,
        );
      await audit.append({
        actorUserId: actor.id,
        action: 'device.changed',
        entityType: 'device',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: {
          version: saved.version,
          reason: change.reason,
          status: saved.status,
          outOfServiceReason: saved.outOfServiceReason,
        },
      });
      return deviceFacts(saved);
    },

    /** Records a meter reading; the server judges it against the tolerance and stores the verdict. */
    async recordCheck(actor: Actor, deviceId: number, input: OutputCheckInput) {
      const device = await deviceOr404(deviceId);
      const isLaser = device.kind === 'laser';
      const [setField, measuredField, wrong] = isLaser
        ? ([
            'powerSetMw',
            'powerMeasuredMw',
            ['irradianceSetMwPerCm2', 'irradianceMeasuredMwPerCm2'],
          ] as const)
        : ([
            'irradianceSetMwPerCm2',
            'irradianceMeasuredMwPerCm2',
            ['powerSetMw', 'powerMeasuredMw'],
          ] as const);
      const problems: { path: string; message: string }[] = [
        ...[setField, measuredField]
          .filter((f) => input[f] === undefined)
          .map((f) => ({
            path: f,
            message: `${f} is required for a ${isLaser ? 'laser (checked in mW)' : 'UV source (checked in mW/cm² at the treatment distance)'}`,
          })),
        ...wrong
          .filter((f) => input[f] !== undefined)
          .map((f) => ({
            path: f,
            message: `${f} does not apply to a ${isLaser ? 'laser' : 'UV source'}`,
          })),
      ];
      if (input.meterCalibrationDueOn < today())
        problems.push({
          path: 'meterCalibrationDueOn',
          message: `the meter's calibration ran out on ${input.meterCalibrationDueOn}; use a calibrated meter (due on or after ${today()})`,
        });
      if (problems.length > 0)
        throw AppError.badRequest('The output check cannot be recorded as it stands.', problems);
      const setValue = input[setField]!;
      const measuredValue = input[measuredField]!;
      const tolerance = await toleranceFor(device.kind, input.orderId);
      const passed = outputCheckPasses(setValue, measuredValue, tolerance.pct);
      const saved = await devices.insertCheck({
        deviceId,
        checkedAt: deps.clock.now(),
        checkedById: actor.id,
        quantity: isLaser ? 'power' : 'irradiance',
        setValue,
        measuredValue,
        meterIdentity: input.meterIdentity,
        meterCalibrationDueOn: input.meterCalibrationDueOn,
        tolerancePct: tolerance.pct,
        toleranceFrom: tolerance.from,
        differencePct: differencePct(measuredValue, setValue),
        passed,
        orderId: input.orderId ?? null,
        note: input.note ?? null,
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'device.output-checked',
        entityType: 'device',
        entityId: deviceId,
        ipAddress: actor.ipAddress,
        details: {
          checkId: saved.id,
          setValue,
          measuredValue,
          passed,
          tolerancePct: tolerance.pct,
        },
      });
      const after = await readiness(device);
      return { check: checkFacts({ ...saved, checkedBy: null as never }), ...after };
    },

    lenses: async (includeRetired: boolean) =>
      (await devices.listLenses(includeRetired)).map((l) => ({
        id: l.id,
        name: l.name,
        laserSpotFactor: l.laserSpotFactor,
        imageMagnification: l.imageMagnification,
        active: l.active,
      })),

    async addLens(actor: Actor, input: LensInput) {
      try {
        const saved = await devices.createLens(input, actor.id);
        await audit.append({
          actorUserId: actor.id,
          action: 'lens.added',
          entityType: 'lens',
          entityId: saved.id,
          ipAddress: actor.ipAddress,
          details: { ...input },
        });
        return saved;
      } catch (error) {
        if (isDuplicateKey(error))
          throw AppError.conflict(
            'duplicate_name',
            `A lens called "${input.name}" is on the register already.`,
          );
        throw error;
      }
    },

    async retireLens(actor: Actor, id: number) {
      const lens = await devices.findLens(id);
      if (!lens) throw AppError.notFound(`There is no lens ${id}.`);
      await devices.retireLens(id);
      await audit.append({
        actorUserId: actor.id,
        action: 'lens.retired',
        entityType: 'lens',
        entityId: id,
        ipAddress: actor.ipAddress,
        details: { name: lens.name },
      });
      return { ...lens, active: false };
    },
  };
}

export type DeviceService = ReturnType<typeof createDeviceService>;
