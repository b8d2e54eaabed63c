import { useEffect, useRef, useState } from 'react';
import type { SessionClock } from '../../../../shared/session/session-clock';
import type { Urgency } from './use-announcer';
import { runningAudio, turnOnAudioOutput } from './use-audio-output';

export type CueKind = 'soon' | 'now' | 'drop';

/** Seconds before a change that the first, softer cue sounds. */
export const cueLeadS = 5;
/** While a timed step runs past zero, the loud cue repeats this often until someone ends it. */
const overrunReminderS = 15;
/** Drop intervals shorter than this (swelling: every 20 s) get no extra warning before each drop. */
const shortestIntervalWithLeadS = 60;

/* Tones made in code: a start time (s), length (s) and pitch (Hz) per note. No audio files. */
const tunes: Record<CueKind, { atS: number; lengthS: number; hz: number }[]> = {
  soon: [
    { atS: 0, lengthS: 0.12, hz: 880 },
    { atS: 0.22, lengthS: 0.12, hz: 880 },
  ],
  now: [
    { atS: 0, lengthS: 0.3, hz: 1046.5 },
    { atS: 0.42, lengthS: 0.3, hz: 1046.5 },
    { atS: 0.84, lengthS: 0.5, hz: 1318.5 },
  ],
  drop: [
    { atS: 0, lengthS: 0.16, hz: 659.3 },
    { atS: 0.2, lengthS: 0.28, hz: 987.8 },
  ],
};
const vibrations: Record<CueKind, number[]> = {
  soon: [120],
  now: [300, 150, 300, 150, 500],
  drop: [200, 100, 200],
};

/** One cue's tones on the running output; nothing when the browser has not let the page make sound. */
export function playCue(kind: CueKind): void {
  const audio = runningAudio();
  if (!audio) return;
  const startS = audio.currentTime + 0.02;
  for (const note of tunes[kind]) {
    const oscillator = audio.createOscillator();
    const gain = audio.createGain();
    oscillator.type = kind === 'now' ? 'square' : 'sine';
    oscillator.frequency.value = note.hz;
    const fromS = startS + note.atS;
    const toS = fromS + note.lengthS;
    // Short ramps at both ends: no click, still a sharp edge to the sound.
    gain.gain.setValueAtTime(0, fromS);
    gain.gain.linearRampToValueAtTime(kind === 'now' ? 0.3 : 0.45, fromS + 0.01);
    gain.gain.setValueAtTime(kind === 'now' ? 0.3 : 0.45, toS - 0.03);
    gain.gain.linearRampToValueAtTime(0, toS);
    oscillator.connect(gain).connect(audio.destination);
    oscillator.start(fromS);
    oscillator.stop(toS + 0.02);
  }
}

function vibrate(kind: CueKind): void {
  // Chrome refuses (and complains) before the page has been touched; a reloaded page waits for a tap.
  const activation = (navigator as Navigator & { userActivation?: { hasBeenActive: boolean } })
    .userActivation;
  if (typeof navigator.vibrate !== 'function' || activation?.hasBeenActive === false) return;
  try {
    navigator.vibrate(vibrations[kind]);
  } catch {
    // Vibration is a courtesy; its absence is fine.
  }
}

interface Snapshot {
  stepId: string | null;
  remainingS: number | null;
  lightStartInS: number | null;
  dropCueInS: number | null;
  dropCount: number;
}

const crossed = (before: number | null, now: number | null, mark: number) =>
  before !== null && now !== null && before > mark && now <= mark;

export interface CueWords {
  /** "laser", "UV", "infusion"… */
  stepName: string;
}

export interface Flash {
  kind: CueKind;
  text: string;
  untilMs: number;
}

/**
 * Sound, vibration, a flash and a spoken line at the moments that matter: a few seconds before
 * and at the end of a timed step, before and at the PDT light start, and at each drop. Only a
 * crossing of a mark cues, so a reload or a wake from sleep does not replay old cues.
 */
export function useCues({
  clock,
  cueEveryS,
  dropCount,
  isDropStep,
  muted,
  enabled,
  words,
  announce,
}: {
  clock: SessionClock;
  cueEveryS: number | null;
  dropCount: number;
  isDropStep: boolean;
  muted: boolean;
  /** Off for someone only watching: the cues call the person at the bedside to act. */
  enabled: boolean;
  words: CueWords;
  announce: (text: string, urgency?: Urgency) => void;
}): Flash | null {
  const previous = useRef<Snapshot | null>(null);
  const lastReminderMs = useRef(0);
  const [flash, setFlash] = useState<Flash | null>(null);

  useEffect(() => {
    // Any tap or key press on the page may open the sound; the screen shows what the browser allowed.
    const unlock = () => void turnOnAudioOutput();
    document.addEventListener('pointerdown', unlock, true);
    document.addEventListener('keydown', unlock, true);
    return () => {
      document.removeEventListener('pointerdown', unlock, true);
      document.removeEventListener('keydown', unlock, true);
    };
  }, []);

  useEffect(() => {
    const current = clock.current;
    const running = current !== null && !current.paused;
    // A PDT wait is timed by the light start (from the infusion start), not by its own length.
    const timedByLight = current?.kind === 'wait' && clock.lightStartInS !== null;
    const snapshot: Snapshot = {
      stepId: current?.id ?? null,
      remainingS: running && !timedByLight ? current.remainingS : null,
      lightStartInS: clock.lightStartInS,
      dropCueInS: isDropStep ? clock.nextCueInS : null,
      dropCount,
    };
    const before = previous.current;
    previous.current = snapshot;
    // A step that starts or ends was tapped by someone standing there; it needs no cue.
    if (!enabled || !before || before.stepId !== snapshot.stepId) return;

    const cue = (kind: CueKind, text: string, urgency: Urgency | null) => {
      if (!muted) playCue(kind);
      vibrate(kind);
      setFlash({ kind, text, untilMs: Date.now() + 1600 });
      if (urgency) announce(text, urgency);
    };
    const nowMs = Date.now();
    const dropWasDue =
      before.dropCueInS !== null &&
      snapshot.dropCueInS !== null &&
      snapshot.dropCueInS > before.dropCueInS + 0.5 &&
      snapshot.dropCount === before.dropCount;
    const leadForDrops = cueEveryS !== null && cueEveryS >= shortestIntervalWithLeadS;

    if (crossed(before.remainingS, snapshot.remainingS, 0)) {
      lastReminderMs.current = nowMs;
      cue('now', `Time is up for the ${words.stepName}. End it when ready.`, 'assertive');
    } else if (crossed(before.lightStartInS, snapshot.lightStartInS, 0)) {
      lastReminderMs.current = nowMs;
      cue('now', 'The light is due now: start the laser.', 'assertive');
    } else if (dropWasDue) {
      cue('drop', 'Riboflavin drop due.', 'polite');
    } else if (crossed(before.remainingS, snapshot.remainingS, cueLeadS)) {
      cue('soon', `${cueLeadS} seconds left for the ${words.stepName}.`, 'polite');
    } else if (crossed(before.lightStartInS, snapshot.lightStartInS, cueLeadS)) {
      cue('soon', `Light due in ${cueLeadS} seconds.`, 'polite');
    } else if (leadForDrops && crossed(before.dropCueInS, snapshot.dropCueInS, cueLeadS)) {
      cue('soon', `Drop due in ${cueLeadS} seconds.`, null);
    } else if (
      snapshot.remainingS === 0 &&
      nowMs - lastReminderMs.current >= overrunReminderS * 1000
    ) {
      lastReminderMs.current = nowMs;
      cue('now', `Time is up for the ${words.stepName}. End it when ready.`, null);
    } else if (
      snapshot.lightStartInS !== null &&
      snapshot.lightStartInS <= 0 &&
      nowMs - lastReminderMs.current >= overrunReminderS * 1000
    ) {
      lastReminderMs.current = nowMs;
      cue('now', 'The light is late: start the laser.', null);
    }
  }, [announce, clock, cueEveryS, dropCount, enabled, isDropStep, muted, words.stepName]);

  // A flash shows for its time, then goes by itself.
  useEffect(() => {
    if (flash === null) return;
    const timer = setTimeout(() => setFlash(null), Math.max(0, flash.untilMs - Date.now()));
    return () => clearTimeout(timer);
  }, [flash]);

  return flash;
}
