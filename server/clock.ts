/**
 * The server's one source of business time, made once in createApp and handed to every service.
 * Tests that run sessions in accelerated time hand in their own.
 */
export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };
