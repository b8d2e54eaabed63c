import type { DataSource } from 'typeorm';
import type {
  DeviceChecks,
  ProtocolVersion as ProtocolDefinition,
} from '../../shared/protocol/protocol-schema';
import type { DeviceInput, LensInput } from '../../shared/schemas/devices';
import type { CheckFacts, DeviceFacts } from '../../shared/session/device-readiness';
import { Device, DeviceVersion, Lens, OutputCheck } from '../db/entities/device';
import { managerOf, type Transaction } from '../db/unit-of-work';

const parseJson = <T>(v: unknown): T => (typeof v === 'string' ? JSON.parse(v) : v) as T;

const range = (min: number | null, max: number | null) =>
  min === null || max === null ? null : { min, max };

/** A device row as the API and the readiness rule read it. */
export function deviceFacts(d: Device) {
  return {
    id: d.id,
    name: d.name,
    kind: d.kind,
    wavelengthNm: d.wavelengthNm,
    serialNumber: d.serialNumber,
    location: d.location,
    powerRangeMw: range(d.powerMinMw, d.powerMaxMw),
    spotRangeUm: range(d.spotMinUm, d.spotMaxUm),
    irradianceRangeMwPerCm2: range(d.irradianceMinMwPerCm2, d.irradianceMaxMwPerCm2),
    pulsedAvailable: d.pulsedAvailable,
    serviceDueOn: d.serviceDueOn,
    status: d.status,
    outOfServiceReason: d.outOfServiceReason,
    version: d.version,
  } satisfies DeviceFacts & Record<string, unknown>;
}
export type DeviceDto = ReturnType<typeof deviceFacts>;

export function checkFacts(c: OutputCheck) {
  return {
    id: c.id,
    deviceId: c.deviceId,
    checkedAt: c.checkedAt.toISOString(),
    checkedById: c.checkedById,
    checkedByName: c.checkedBy?.displayName ?? null,
    quantity: c.quantity,
    unit: c.quantity === 'power' ? 'mW' : 'mW/cm²',
    setValue: c.setValue,
    measuredValue: c.measuredValue,
    meterIdentity: c.meterIdentity,
    meterCalibrationDueOn: c.meterCalibrationDueOn,
    tolerancePct: c.tolerancePct,
    toleranceFrom: c.toleranceFrom,
    differencePct: c.differencePct,
    passed: c.passed,
    orderId: c.orderId,
    note: c.note,
  } satisfies CheckFacts & Record<string, unknown>;
}
export type OutputCheckDto = ReturnType<typeof checkFacts>;

function columnsOf(input: DeviceInput) {
  return {
    name: input.name,
    kind: input.kind,
    wavelengthNm: input.wavelengthNm,
    serialNumber: input.serialNumber,
    location: input.location,
    powerMinMw: input.powerRangeMw?.min ?? null,
    powerMaxMw: input.powerRangeMw?.max ?? null,
    spotMinUm: input.spotRangeUm?.min ?? null,
    spotMaxUm: input.spotRangeUm?.max ?? null,
    irradianceMinMwPerCm2: input.irradianceRangeMwPerCm2?.min ?? null,
    irradianceMaxMwPerCm2: input.irradianceRangeMwPerCm2?.max ?? null,
    pulsedAvailable: input.pulsedAvailable,
    serviceDueOn: input.serviceDueOn,
    status: input.status,
    outOfServiceReason: input.outOfServiceReason,
  };
}

export function createDeviceRepository(dataSource: DataSource) {
  const devices = dataSource.getRepository(Device);
  const checks = dataSource.getRepository(OutputCheck);
  const lenses = dataSource.getRepository(Lens);

  return {
    list: () => devices.find({ order: { kind: 'ASC', name: 'ASC' } }),
    findById: (id: number) => devices.findOneBy({ id }),
    findByName: (name: string) => devices.findOneBy({ name }),

    /** A new device and its first version, in the caller's transaction. */
    async create(tx: Transaction, input: DeviceInput, by: number, at: Date): Promise<Device> {
      const manager = managerOf(tx);
      const saved = await manager
        .getRepository(Device)
        .save(manager.getRepository(Device).create({ ...columnsOf(input), version: 1 }));
      await manager.getRepository(DeviceVersion).insert({
        deviceId: saved.id,
        version: 1,
        snapshot: { ...input, reason: 'added to the register' } as never,
        changedById: by,
        changedAt: at,
      });
      return saved;
    },

    /**
     * Saves a change only if the device is still at `version` (a stale screen changes nothing),
     * and keeps the new version beside the old ones. Null when the version moved on.
     */
    async update(
      tx: Transaction,
      id: number,
      version: number,
      input: DeviceInput,
      reason: string,
      by: number,
      at: Date,
    ): Promise<Device | null> {
      const manager = managerOf(tx);
      const result = await manager
        .getRepository(Device)
        .update({ id, version }, { ...columnsOf(input), version: version + 1 });
      if (!result.affected) return null;
      await manager.getRepository(DeviceVersion).insert({
        deviceId: id,
        version: version + 1,
        snapshot: { ...input, reason } as never,
        changedById: by,
        changedAt: at,
      });
      return manager.getRepository(Device).findOneByOrFail({ id });
    },

    versions: (deviceId: number) =>
      dataSource.getRepository(DeviceVersion).find({
        where: { deviceId },
        relations: { changedBy: true },
        order: { version: 'DESC' },
      }),

    insertCheck: (check: Omit<OutputCheck, 'id' | 'device' | 'checkedBy'>) =>
      checks.save(checks.create(check)),

    /** The device's latest output check (by the time it was made), or null. */
    lastCheck: (deviceId: number) =>
      checks.findOne({
        where: { deviceId },
        order: { checkedAt: 'DESC', id: 'DESC' },
        relations: { checkedBy: true },
      }),

    checksOf: (deviceId: number, limit: number) =>
      checks.find({
        where: { deviceId },
        order: { checkedAt: 'DESC', id: 'DESC' },
        relations: { checkedBy: true },
        take: limit,
      }),

    /** The approved protocol versions' device checks, to judge a check made outside an order. */
    async approvedDeviceChecks(): Promise<
      { key: string; version: number; kind: string; deviceChecks: DeviceChecks | undefined }[]
    > {
      const rows: { key: string; version: number; definition: unknown }[] = await dataSource.query(
        "SELECT protocol_key AS `key`, version, definition FROM protocol_version WHERE status = 'approved'",
      );
      return rows.map((row) => {
        const definition = parseJson<ProtocolDefinition>(row.definition);
        return {
          key: row.key,
          version: Number(row.version),
          kind: definition.kind,
          deviceChecks: definition.deviceChecks,
        };
      });
    },

    /** An order's protocol (key, version, definition) and its inputs, for a check or a session start. */
    async orderProtocol(orderId: number) {
      const [row] = await dataSource.query(
        'SELECT o.id, o.status, o.inputs, v.protocol_key AS `key`, v.version, v.definition FROM treatment_order o JOIN protocol_version v ON v.id = o.protocol_version_id WHERE o.id = ?',
        [orderId],
      );
      if (!row) return null;
      return {
        orderId: Number(row.id),
        status: String(row.status),
        inputs: parseJson<{ lensId?: number; lensMagnification?: number }>(row.inputs),
        key: String(row.key),
        version: Number(row.version),
        definition: parseJson<ProtocolDefinition>(row.definition),
      };
    },

    listLenses: (includeRetired: boolean) =>
      lenses.find({ where: includeRetired ? {} : { active: true }, order: { name: 'ASC' } }),
    findLens: (id: number) => lenses.findOneBy({ id }),
    findLensByName: (name: string) => lenses.findOneBy({ name }),
    createLens: (input: LensInput, by: number) =>
      lenses.save(lenses.create({ ...input, active: true, createdById: by })),
    retireLens: (id: number) => lenses.update({ id }, { active: false }),
  };
}

export type DeviceRepository = ReturnType<typeof createDeviceRepository>;
