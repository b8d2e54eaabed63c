import { useCallback, useRef } from 'react';
import { useSearchParams } from 'react-router-dom';

type SearchChange = (latest: URLSearchParams) => URLSearchParams;

function sameSearch(a: URLSearchParams | string, b: URLSearchParams | string): boolean {
  return new URLSearchParams(a).toString() === new URLSearchParams(b).toString();
}

/**
 * The address's search params, and a setter whose change is applied to the address as it stands
 * when the change is made.
 *
 * React Router's own setter (in both of its forms) starts from the params of the last render, and
 * a navigation reaches the screen only in a later render; two changes made before that render
 * would both start from the same old params, and the second would silently undo the first. The
 * router writes the address bar as soon as it is asked, unless the route has data to load first,
 * so a change starts from the address bar, or from the change still waiting to be written there.
 */
export function useLatestSearchParams(): [URLSearchParams, (change: SearchChange) => void] {
  const [search, setSearch] = useSearchParams();
  // A change the router has not yet written to the address bar, and the address it was made over.
  const unwritten = useRef<{ over: string; search: URLSearchParams } | null>(null);

  const changeSearch = useCallback(
    (change: SearchChange) => {
      const current = window.location.search;
      const waiting = unwritten.current;
      // Once the address has moved on (the change was written, or the person went back), it is the truth again.
      const latest = new URLSearchParams(
        waiting && waiting.over === current ? waiting.search : current,
      );
      const next = change(latest);
      setSearch(next);
      unwritten.current =
        window.location.search === current && !sameSearch(next, current)
          ? { over: current, search: next }
          : null;
    },
    [setSearch],
  );

  return [search, changeSearch];
}
