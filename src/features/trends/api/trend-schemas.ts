import { z } from 'zod';

export const trendMonthSchema = z.object({
  month: z.string().regex(/^\d{4}-\d{2}$/),
  protocolKey: z.string(),
  protocolVersion: z.number().int(),
  protocolTitle: z.string(),
  sessions: z.number().int(),
  sessionsWithDeviation: z.number().int(),
  ratePct: z.number(),
});
export type TrendMonth = z.infer<typeof trendMonthSchema>;

export const trendsResponseSchema = z.object({ months: z.array(trendMonthSchema) });
