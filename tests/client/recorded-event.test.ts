import { describe, expect, it } from 'vitest';
import {
  withRecordedEvent,
  type RecordedEventResponse,
  type SessionState,
} from '../../src/lib/queries/session-schema';
import type { GivenRecord } from '../../src/lib/session-record-schemas';
import type { SessionEvent } from '../../shared/session/session-events';

// How the step clock folds one recorded event's answer into what the tablet shows. The figures
// are made up for the test; nothing clinical is checked here.

const startMs = Date.parse('2026-03-02T09:00:00.000Z');
const stored = (
  id: number,
  offsetS: number,
  type: 'drop-given' | 'step-started' = 'drop-given',
): SessionEvent => ({
  id,
  idempotencyKey: `00000000-0000-4000-8000-${String(id).padStart(12, '0')}`,
  clientTime: new Date(startMs + offsetS * 1000).toISOString(),
  serverTime: new Date(startMs + offsetS * 1000 + 80).toISOString(),
  recordedBy: 7,
  type,
  stepId: 'riboflavin-soak',
});

const record = (soakDurationS: number): GivenRecord => ({
  kind: 'cxl',
  outcome: 'in-progress',
  sessionStartedAt: null,
  endedAt: null,
  stopReason: null,
  infusionStartAt: null,
  infusionEndAt: null,
  extravasationAt: null,
  lightStartAt: null,
  lightEndAt: null,
  soakStartAt: null,
  soakEndAt: null,
  longestDropGapSoakS: null,
  longestDropGapUvS: null,
  thicknessOverrideReason: null,
  uvStartAt: null,
  uvEndAt: null,
  withdrawnTaps: [],
  receiptDelays: [],
  infusionDurationS: null,
  volumeGivenMl: null,
  lightStartAfterInfusionStartS: null,
  lightOnS: null,
  soakDurationS,
  thicknessBeforeUvUm: null,
  uvElapsedS: null,
  uvOnS: null,
  irradianceMwPerCm2: null,
  deliveredFluenceJPerCm2: null,
  volumeGivenSource: null,
  doseGivenMg: null,
  plannedDoseMg: null,
  deviceExposureS: null,
  deviceEnergyJ: null,
  lateEntries: [],
});

const state = (events: SessionEvent[], soakS: number): SessionState => ({
  orderId: 4,
  status: 'in-session',
  events,
  record: record(soakS),
  deviations: [],
  serverTime: new Date(startMs).toISOString(),
  nurses: [],
});
const answer = (event: SessionEvent, eventCount: number, soakS: number): RecordedEventResponse => ({
  orderId: 4,
  status: 'in-session',
  event,
  eventCount,
  record: record(soakS),
  deviations: [],
  serverTime: new Date(startMs + 1000).toISOString(),
  replayed: false,
});

describe('folding a recorded event into the session the tablet shows', () => {
  it('adds the new event in time order and takes the record from the answer', () => {
    const current = state([stored(1, 0, 'step-started'), stored(3, 240)], 240);
    const { state: next, complete } = withRecordedEvent(current, answer(stored(5, 120), 3, 300));
    expect(next.events.map((e) => e.id)).toEqual([1, 5, 3]);
    expect(next.record?.soakDurationS).toBe(300);
    expect(complete).toBe(true);
  });

  it('keeps the newer record when an older answer arrives late, but still shows its event', () => {
    const current = state([stored(1, 0, 'step-started'), stored(3, 120), stored(4, 240)], 600);
    // This answer left the server when it knew of 2 events; the list now holds 3 without it.
    const { state: next, complete } = withRecordedEvent(current, answer(stored(2, 60), 2, 60));
    expect(next.events.map((e) => e.id)).toEqual([1, 2, 3, 4]);
    expect(next.record?.soakDurationS).toBe(600);
    expect(complete).toBe(true);
  });

  it('says the list is incomplete when the server holds events another tablet stored', () => {
    const current = state([stored(1, 0, 'step-started')], 0);
    const { state: next, complete } = withRecordedEvent(current, answer(stored(9, 300), 4, 300));
    expect(next.events).toHaveLength(2);
    expect(complete).toBe(false);
  });

  it('does not list a resent event twice', () => {
    const current = state([stored(1, 0, 'step-started'), stored(2, 60)], 60);
    const { state: next } = withRecordedEvent(current, {
      ...answer(stored(2, 60), 2, 60),
      replayed: true,
    });
    expect(next.events).toHaveLength(2);
  });
});
