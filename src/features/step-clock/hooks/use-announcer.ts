import { useCallback, useState } from 'react';

export type Urgency = 'polite' | 'assertive';
export interface Announcement {
  text: string;
  /** Grows with every announcement, so the same words said twice are read twice. */
  serial: number;
}

/**
 * Words for the screen reader's live regions: step changes politely, warnings assertively.
 * The running numbers are never put here; a reader hears the clock when it asks for it.
 */
export function useAnnouncer() {
  const [polite, setPolite] = useState<Announcement | null>(null);
  const [assertive, setAssertive] = useState<Announcement | null>(null);
  const announce = useCallback((text: string, urgency: Urgency = 'polite') => {
    const setter = urgency === 'assertive' ? setAssertive : setPolite;
    setter((previous) => ({ text, serial: (previous?.serial ?? 0) + 1 }));
  }, []);
  return { polite, assertive, announce };
}
