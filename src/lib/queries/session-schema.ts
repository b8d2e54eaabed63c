import { z } from 'zod';
import { givenRecordSchema, type GivenRecord } from '../session-record-schemas';
import { orderStatuses } from '../../../shared/schemas/orders';
import {
  deviationSeverities,
  sessionEventSchema,
  type SessionEvent,
} from '../../../shared/session/session-events';

/**
 * A stored event: the event contract plus what the server added. The contract's objects are
 * strict, so the server's own fields are taken off before the event is checked against it.
 */
export const storedEventSchema = z
  .looseObject({ id: z.number(), serverTime: z.string(), recordedBy: z.number() })
  .transform((raw, ctx): SessionEvent => {
    const { id, serverTime, recordedBy, authorisedById, authorisedByName, deviceRecord, ...input } =
      raw;
    const parsed = sessionEventSchema.safeParse(input);
    if (!parsed.success) {
      ctx.addIssue({
        code: 'custom',
        message: `stored event ${id} does not match the event contract`,
      });
      return z.NEVER;
    }
    return {
      ...parsed.data,
      id,
      serverTime,
      recordedBy,
      ...(typeof authorisedById === 'number' ? { authorisedById } : {}),
      ...(typeof authorisedByName === 'string' ? { authorisedByName } : {}),
      // A session start's device as the server found it (shown, never sent back).
      ...(deviceRecord && typeof deviceRecord === 'object'
        ? { deviceRecord: deviceRecord as SessionEvent['deviceRecord'] }
        : {}),
    };
  });

export const sessionDeviationSchema = z.object({
  id: z.number(),
  type: z.string(),
  severity: z.enum(deviationSeverities),
  expected: z.number().nullable(),
  actual: z.number().nullable(),
  unit: z.string().nullable(),
  message: z.string(),
  detectedAt: z.string(),
});
export type SessionDeviation = z.infer<typeof sessionDeviationSchema>;

/** The dose record as the server derived it; null until the first event is stored. */
export type SessionRecordSummary = GivenRecord;

/**
 * What GET /orders/:id/session and every recorded event answer with: one shape for every screen
 * that shows a session (the step clock, the order, the printed record).
 */
export const sessionStateSchema = z.object({
  orderId: z.number(),
  status: z.enum(orderStatuses),
  events: z.array(storedEventSchema),
  record: givenRecordSchema.nullable(),
  deviations: z.array(sessionDeviationSchema),
  serverTime: z.string(),
  /** Who ran the session at the bedside (the whole session's answer; an event's answer leaves it out). */
  nurses: z.array(z.string()).default([]),
});
export type SessionState = z.infer<typeof sessionStateSchema>;

/** What a recorded event answers with: that event, how many the session has now, and what follows from them. */
export const recordedEventResponseSchema = sessionStateSchema
  .omit({ events: true, nurses: true })
  .extend({
    event: storedEventSchema,
    eventCount: z.number().int().nonnegative(),
    replayed: z.boolean(),
  });
export type RecordedEventResponse = z.infer<typeof recordedEventResponseSchema>;

/**
 * Events are only ever added, so of two answers the one with fewer events is the older: an
 * answer that was on its way while a newer one arrived must not take events off the screen.
 */
export function newerSessionState(
  current: SessionState | undefined,
  incoming: SessionState,
): SessionState {
  if (
    current &&
    current.orderId === incoming.orderId &&
    incoming.events.length < current.events.length
  )
    return current;
  return incoming;
}

/**
 * The cached session with one recorded event's answer folded in. The event joins the list if it
 * is not there yet; the record, deviations and status are taken only from an answer that has seen
 * at least as many events as the list now holds (an older answer arriving late changes nothing
 * else). `complete` is false when the server holds events this list lacks (another tablet's): the
 * caller then fetches the whole session.
 */
export function withRecordedEvent(
  current: SessionState,
  answer: RecordedEventResponse,
): { state: SessionState; complete: boolean } {
  const known = current.events.some(
    (event) => event.idempotencyKey === answer.event.idempotencyKey,
  );
  const events = known
    ? current.events
    : [...current.events, answer.event].sort(
        (a, b) => Date.parse(a.clientTime) - Date.parse(b.clientTime) || a.id - b.id,
      );
  const newer = answer.eventCount >= events.length;
  const state: SessionState = newer
    ? {
        orderId: current.orderId,
        status: answer.status,
        events,
        record: answer.record,
        deviations: answer.deviations,
        serverTime: answer.serverTime,
        nurses: current.nurses,
      }
    : { ...current, events };
  return { state, complete: answer.eventCount <= events.length };
}
