import { useEffect } from 'react';
import { playCue } from './use-cues';

/** While a drop stays due, its tone sounds again this often until someone taps Drop given. */
export const dropReminderEveryS = 20;

/**
 * The drop's tone once more every `dropReminderEveryS` while a drop is overdue (the first tone
 * sounds when it falls due, from useCues). Silent when muted or only watching.
 */
export function useDropReminder({ due, sound }: { due: boolean; sound: boolean }): void {
  useEffect(() => {
    if (!due || !sound) return;
    const timer = window.setInterval(() => playCue('drop'), dropReminderEveryS * 1000);
    return () => window.clearInterval(timer);
  }, [due, sound]);
}
