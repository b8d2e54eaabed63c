import { useSyncExternalStore } from 'react';

/**
 * The tablet's sound output for the cues, and the truth about it. Browsers let a page make sound
 * only after a tap or key press on it, so after every load (a reload, a restarted tablet) the
 * output starts off: no AudioContext exists until a gesture creates and resumes one. The screen
 * reads `audioOutputState()` and claims sound only when the context says it is running.
 */
export type AudioOutputState = 'unsupported' | 'not-started' | 'suspended' | 'running';

let audio: AudioContext | null = null;
let state: AudioOutputState = audioContextClass() ? 'not-started' : 'unsupported';
const listeners = new Set<() => void>();

function audioContextClass(): typeof AudioContext | null {
  if (typeof window === 'undefined') return null;
  return (
    window.AudioContext ??
    (window as Window & { webkitAudioContext?: typeof AudioContext }).webkitAudioContext ??
    null
  );
}

function follow(): void {
  // 'interrupted' (a phone call on some tablets) and 'closed' play nothing, like 'suspended'.
  const next: AudioOutputState =
    audio === null
      ? audioContextClass()
        ? 'not-started'
        : 'unsupported'
      : audio.state === 'running'
        ? 'running'
        : 'suspended';
  if (next === state) return;
  state = next;
  for (const listener of listeners) listener();
}

/**
 * Called from a tap or key press (only then does the browser allow it): creates the context if
 * needed and asks it to resume. Resolves with the state the context is really in afterwards.
 */
export async function turnOnAudioOutput(): Promise<AudioOutputState> {
  const Context = audioContextClass();
  if (!Context) return state;
  try {
    if (!audio || audio.state === 'closed') {
      audio = new Context();
      audio.addEventListener('statechange', follow);
    }
    if (audio.state !== 'running') await audio.resume();
  } catch {
    // Refused (no gesture, or no output device): the state below says so.
  }
  follow();
  return state;
}

export function audioOutputState(): AudioOutputState {
  return state;
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function useAudioOutputState(): AudioOutputState {
  return useSyncExternalStore(subscribe, audioOutputState, audioOutputState);
}

/** The running context, or null when a tone would not be heard (so nothing is scheduled). */
export function runningAudio(): AudioContext | null {
  return audio !== null && audio.state === 'running' ? audio : null;
}
