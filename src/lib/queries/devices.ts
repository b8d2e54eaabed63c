import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { deviceBlockKinds, deviceKinds, deviceStatuses } from '../../../shared/schemas/devices';
import { api } from '../api-client';
import type { Fetching } from './request';
import { segment } from './request';

/* One cache for the device register, its output checks and the lens register. */

const rangeSchema = z.object({ min: z.number(), max: z.number() }).nullable();

export const outputCheckSchema = z.object({
  id: z.number(),
  checkedAt: z.string(),
  checkedByName: z.string().nullable(),
  quantity: z.enum(['power', 'irradiance']),
  unit: z.string(),
  setValue: z.number(),
  measuredValue: z.number(),
  meterIdentity: z.string(),
  meterCalibrationDueOn: z.string(),
  tolerancePct: z.number(),
  toleranceFrom: z.string(),
  differencePct: z.number(),
  passed: z.boolean(),
  orderId: z.number().nullable(),
  note: z.string().nullable(),
});
export type OutputCheck = z.infer<typeof outputCheckSchema>;

export const deviceSchema = z.object({
  id: z.number(),
  name: z.string(),
  kind: z.enum(deviceKinds),
  wavelengthNm: z.number(),
  serialNumber: z.string(),
  location: z.string(),
  powerRangeMw: rangeSchema,
  spotRangeUm: rangeSchema,
  irradianceRangeMwPerCm2: rangeSchema,
  pulsedAvailable: z.boolean(),
  serviceDueOn: z.string(),
  status: z.enum(deviceStatuses),
  outOfServiceReason: z.string().nullable(),
  version: z.number(),
  lastCheck: outputCheckSchema.nullable(),
  blocks: z.array(z.object({ kind: z.enum(deviceBlockKinds), message: z.string() })),
});
export type Device = z.infer<typeof deviceSchema>;

const devicesResponseSchema = z.object({ devices: z.array(deviceSchema) });
export const deviceDetailSchema = z.object({
  device: deviceSchema,
  checks: z.array(outputCheckSchema),
  versions: z.array(
    z.object({
      version: z.number(),
      changedAt: z.string(),
      changedByName: z.string().nullable(),
      snapshot: z.record(z.string(), z.unknown()),
    }),
  ),
});
export type DeviceDetail = z.infer<typeof deviceDetailSchema>;

export const lensSchema = z.object({
  id: z.number(),
  name: z.string(),
  laserSpotFactor: z.number(),
  imageMagnification: z.number(),
  active: z.boolean(),
});
export type Lens = z.infer<typeof lensSchema>;
const lensesResponseSchema = z.object({ lenses: z.array(lensSchema) });

export const recordedCheckSchema = z.object({
  check: outputCheckSchema.omit({ checkedByName: true }).extend({
    checkedByName: z.string().nullable().optional(),
  }),
  lastCheck: outputCheckSchema.nullable(),
  blocks: deviceSchema.shape.blocks,
});

export const deviceKeys = {
  all: () => ['devices'] as const,
  list: () => [...deviceKeys.all(), 'list'] as const,
  detail: (id: number) => [...deviceKeys.all(), 'detail', id] as const,
  lenses: () => ['lenses'] as const,
};

export const devicesQuery = () =>
  queryOptions({
    queryKey: deviceKeys.list(),
    queryFn: async ({ signal }: Fetching) =>
      (await api.get('/devices', { schema: devicesResponseSchema, signal })).devices,
  });

export const deviceQuery = (id: number) =>
  queryOptions({
    queryKey: deviceKeys.detail(id),
    queryFn: ({ signal }: Fetching) =>
      api.get(`/devices/${segment(id)}`, { schema: deviceDetailSchema, signal }),
  });

export const lensesQuery = () =>
  queryOptions({
    queryKey: deviceKeys.lenses(),
    queryFn: async ({ signal }: Fetching) =>
      (await api.get('/lenses', { schema: lensesResponseSchema, signal })).lenses,
  });
