import { useEffect, useRef, useState } from 'react';

/**
 * A sentence to announce (in a polite live region) when `state` changes while the page is open,
 * never on the first render and never for a ticking figure: a screen reader would read that out
 * every second.
 */
export function useStateAnnouncement<TState extends string>(
  state: TState,
  sentence: (state: TState) => string,
): string {
  const [announcement, setAnnouncement] = useState('');
  const shownState = useRef(state);
  useEffect(() => {
    if (shownState.current === state) return;
    shownState.current = state;
    setAnnouncement(sentence(state));
  }, [state, sentence]);
  return announcement;
}
