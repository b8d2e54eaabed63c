import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { treatmentListSchema } from '../../../shared/schemas/lists';
import { api } from '../api-client';
import { segment, type Fetching } from './request';

/** One cache for treatment lists: the week's lists, one list, and a list's vial plan. */

const listsResponseSchema = z.object({
  lists: z.array(treatmentListSchema),
  vialSharingAllowed: z.boolean(),
});
const listResponseSchema = z.object({ list: treatmentListSchema });

export const vialPlanSchema = z.object({
  list: z.object({
    id: z.number(),
    listDate: z.string(),
    room: z.string(),
    deviceLabel: z.string().nullable(),
  }),
  caution: z.string(),
  sharingAllowed: z.boolean(),
  totalDoseMg: z.number(),
  vialsUnshared: z.number(),
  vialsPlanned: z.number(),
  vialsSaved: z.number(),
  steps: z.array(
    z.object({
      orderId: z.number(),
      label: z.string(),
      readyBy: z.string(),
      doseMg: z.number(),
      drugVolumeMl: z.number(),
      vials: z.array(z.number()),
      fromSharedVial: z.boolean(),
    }),
  ),
  vials: z.array(
    z.object({
      number: z.number(),
      reconstituteBy: z.string(),
      reconstituteNotBefore: z.string(),
      orderIds: z.array(z.number()),
      drawnMl: z.number(),
      leftOverMl: z.number(),
      leftOverMg: z.number(),
    }),
  ),
});
export type VialPlan = z.infer<typeof vialPlanSchema>;

export const listKeys = {
  all: () => ['lists'] as const,
  between: (from: string, to: string) => [...listKeys.all(), 'between', from, to] as const,
  vialPlan: (id: number) => [...listKeys.all(), 'vial-plan', id] as const,
};

export const listsBetweenQuery = (from: string, to: string) =>
  queryOptions({
    queryKey: listKeys.between(from, to),
    queryFn: ({ signal }: Fetching) =>
      api.get(`/lists?from=${segment(from)}&to=${segment(to)}`, {
        schema: listsResponseSchema,
        signal,
      }),
  });

export const vialPlanQuery = (id: number) =>
  queryOptions({
    queryKey: listKeys.vialPlan(id),
    queryFn: ({ signal }: Fetching) =>
      api.get(`/lists/${segment(id)}/vial-plan`, { schema: vialPlanSchema, signal }),
  });

export const createList = (body: unknown) =>
  api.post('/lists', body, { schema: listResponseSchema });
export const bookIntoList = (listId: number, body: { orderId: number; slotIndex: number }) =>
  api.post(`/lists/${segment(listId)}/bookings`, body, { schema: listResponseSchema });
export const cancelBooking = (bookingId: number) =>
  api.delete(`/bookings/${segment(bookingId)}`, { schema: listResponseSchema });
