import { useCallback, useState } from 'react';
import { useKeptState } from '../../../lib/form-draft';

/**
 * State that survives a reload (the app's kept drafts: filed under the signed-in nurse, dropped
 * at sign-out and after 12 h): ticks and typed text on the way to a tap are not lost if the
 * tablet reloads before the nurse presses the button, and never shown to the next person.
 */
export function useStoredDraft<T>(key: string, initial: T): [T, (next: T) => void, () => void] {
  return useKeptState(`step-clock.${key}`, initial);
}

/** Whether sound cues are muted on this tablet; remembered across sessions. */
export function useMutedPreference(): [boolean, (muted: boolean) => void] {
  const storageKey = 'luxtempo.step-clock.muted';
  const [muted, setMuted] = useState(() => {
    try {
      return localStorage.getItem(storageKey) === 'true';
    } catch {
      return false;
    }
  });
  const update = useCallback((next: boolean) => {
    setMuted(next);
    try {
      localStorage.setItem(storageKey, String(next));
    } catch {
      // Kept for this page only.
    }
  }, []);
  return [muted, update];
}
