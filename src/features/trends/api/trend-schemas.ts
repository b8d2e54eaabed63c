import { z } from 'zod';
import { deviationSeverities } from '../../../../shared/session/session-events';

export const trendMonthSchema = z.object({
  month: z.string().regex(/^\d{4}-\d{2}$/),
  protocolKey: z.string(),
  protocolVersion: z.number().int(),
  protocolTitle: z.string(),
  sessions: z.number().int(),
  sessionsWithDeviation: z.number().int(),
  ratePct: z.number(),
  /** The month's 3-sigma p-chart limits (per protocol version, from its own count) and its reading. */
  lowerLimitPct: z.number().nullable().optional(),
  upperLimitPct: z.number().nullable().optional(),
  signal: z.enum(['above-upper-limit', 'below-lower-limit']).nullable().optional(),
  reading: z.string().optional(),
});
export type TrendMonth = z.infer<typeof trendMonthSchema>;

/** Deviations of finished sessions in one month and protocol version, of one type and severity. */
export const trendByTypeSchema = z.object({
  month: z.string().regex(/^\d{4}-\d{2}$/),
  protocolKey: z.string(),
  protocolVersion: z.number().int(),
  type: z.string(),
  severity: z.enum(deviationSeverities),
  deviations: z.number().int(),
});
export type TrendByType = z.infer<typeof trendByTypeSchema>;

export const trendsResponseSchema = z.object({
  months: z.array(trendMonthSchema),
  byType: z.array(trendByTypeSchema).optional().default([]),
});
export type TrendsAnswer = z.infer<typeof trendsResponseSchema>;
