import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { recallRowSchema, stockLotSchema } from '../../../shared/schemas/stock';
import { api } from '../api-client';
import { segment, type Fetching } from './request';

/** One cache for the pharmacy's stock, the recall search and the monthly drug report. */

const lotsResponseSchema = z.object({ lots: z.array(stockLotSchema), today: z.string() });
const lotResponseSchema = z.object({ lot: stockLotSchema });
const recallResponseSchema = z.object({ lot: z.string(), rows: z.array(recallRowSchema) });
export const monthUseSchema = z.object({
  month: z.string(),
  vialsIssued: z.number(),
  givenMg: z.number(),
  discardedMg: z.number(),
  givenPct: z.number().nullable(),
  discardedPct: z.number().nullable(),
  preparedNeverInfused: z.number(),
});
export type MonthUse = z.infer<typeof monthUseSchema>;

export const stockKeys = {
  all: () => ['stock'] as const,
  lots: () => [...stockKeys.all(), 'lots'] as const,
  recall: (lot: string) => [...stockKeys.all(), 'recall', lot] as const,
  report: () => [...stockKeys.all(), 'report'] as const,
};

export const stockLotsQuery = () =>
  queryOptions({
    queryKey: stockKeys.lots(),
    queryFn: ({ signal }: Fetching) => api.get('/stock', { schema: lotsResponseSchema, signal }),
  });

export const recallQuery = (lot: string) =>
  queryOptions({
    queryKey: stockKeys.recall(lot),
    queryFn: ({ signal }: Fetching) =>
      api.get(`/recall?lot=${segment(lot)}`, { schema: recallResponseSchema, signal }),
    enabled: lot.length >= 2,
  });

export const drugUseReportQuery = () =>
  queryOptions({
    queryKey: stockKeys.report(),
    queryFn: ({ signal }: Fetching) =>
      api.get('/reports/drug-use', {
        schema: z.object({ months: z.array(monthUseSchema) }),
        signal,
      }),
  });

export const recallCsvHref = (lot: string) => `/api/recall.csv?lot=${segment(lot)}`;

export const receiveStock = (body: unknown) =>
  api.post('/stock', body, { schema: lotResponseSchema });
export const adjustStock = (lotId: number, body: unknown) =>
  api.post(`/stock/${segment(lotId)}/adjustments`, body, { schema: lotResponseSchema });
export const notifyRecall = (lot: string) =>
  api.post(
    '/recall/notifications',
    { lot },
    {
      schema: z.object({ lot: z.string(), messages: z.number(), patients: z.number() }),
    },
  );
