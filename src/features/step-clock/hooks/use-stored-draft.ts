import { useCallback, useRef, useState } from 'react';
import { currentPersonId } from '../../../lib/current-person';

/**
 * State that survives a reload of this tab (sessionStorage): ticks and typed text on the way to
 * a tap are not lost if the tablet reloads before the nurse presses the button. Kept under the
 * signed-in person's id: whoever signs in next on the tablet starts the checks afresh, and
 * signing out drops them all.
 */
export function useStoredDraft<T>(key: string, initial: T): [T, (next: T) => void, () => void] {
  const storageKey = `luxtempo.step-clock.draft.${currentPersonId() ?? 'nobody'}.${key}`;
  // Call sites pass a fresh literal each render; the first one is the value to go back to.
  const initialValue = useRef(initial).current;
  const [value, setValue] = useState<T>(() => {
    try {
      const raw = sessionStorage.getItem(storageKey);
      return raw === null ? initial : (JSON.parse(raw) as T);
    } catch {
      return initial;
    }
  });
  const update = useCallback(
    (next: T) => {
      setValue(next);
      try {
        sessionStorage.setItem(storageKey, JSON.stringify(next));
      } catch {
        // Storage refused: the value still lives in this page.
      }
    },
    [storageKey],
  );
  const clear = useCallback(() => {
    setValue(initialValue);
    try {
      sessionStorage.removeItem(storageKey);
    } catch {
      // Nothing to clear.
    }
  }, [initialValue, storageKey]);
  return [value, update, clear];
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
