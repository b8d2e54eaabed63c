import { describe, expect, it } from 'vitest';
import { mayTakeUpdate, updateIdleMs } from '../../src/lib/app-update';

describe('a new app version waits for the page to be idle', () => {
  const idle = { pathname: '/', idleMs: updateIdleMs, unsentTaps: 0 };

  it('takes over on an idle page with nothing left to send', () => {
    expect(mayTakeUpdate(idle)).toBe(true);
    expect(mayTakeUpdate({ ...idle, pathname: '/sessions/12/discharge' })).toBe(true);
  });

  it('never while a step clock is open, however long nobody touched it', () => {
    expect(mayTakeUpdate({ ...idle, pathname: '/sessions/12', idleMs: 3_600_000 })).toBe(false);
  });

  it('never while taps wait to be sent, nor while someone is using the page', () => {
    expect(mayTakeUpdate({ ...idle, unsentTaps: 1 })).toBe(false);
    expect(mayTakeUpdate({ ...idle, idleMs: updateIdleMs - 1 })).toBe(false);
  });
});
