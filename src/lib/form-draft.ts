import { useCallback, useEffect, useLayoutEffect, useRef, useState } from 'react';
import { useCurrentPersonId } from './current-person';

/**
 * What a person has typed and not yet saved, kept in this browser so that a crash, a reload or a
 * restarted tablet browser never loses it. One store for every form and for the step clock's
 * ticks and typed reasons:
 * - each draft is filed under the signed-in person's id and the form's key (with the order id
 *   where there is one): another person signed in on the same tablet is never offered it;
 * - a draft lives at most `draftLifetimeMs` (12 h): older ones are dropped when read and at start;
 * - saving the form drops its draft, and signing out drops every draft, so health data does not
 *   linger on a shared ward tablet.
 * localStorage rather than sessionStorage, so a closed tab or a browser killed mid-form keeps it too.
 */
export type KeptDraft<T> = {
  ownerId: number;
  savedAt: string;
  values: T;
  /** What the values were based on, e.g. the version of the order read. */ basis?: unknown;
};

export const draftLifetimeMs = 12 * 60 * 60 * 1000;

const prefix = 'luxtempo.draft.';
/** Where earlier releases kept drafts (this tab only); dropped with the rest on sign-out. */
const legacyPrefixes = ['luxtempo.form-draft.', 'luxtempo.step-clock.draft.'];

function browserStore(): Storage | null {
  try {
    return globalThis.localStorage ?? null;
  } catch {
    return null; // storage refused (private mode, policy): drafts then live in the page only
  }
}

const storageKey = (ownerId: number, key: string) => `${prefix}${ownerId}.${key}`;

/**
 * Drafts this page has written or offered and not yet dropped, so the crash screen can say truly
 * whether what was typed is waiting after a reload.
 */
const keptInThisPage = new Set<string>();
const keptListeners = new Set<() => void>();
function noteKept(name: string, kept: boolean) {
  const had = keptInThisPage.has(name);
  if (kept) keptInThisPage.add(name);
  else keptInThisPage.delete(name);
  if (had !== kept) for (const listener of keptListeners) listener();
}
export function draftsKeptInThisPage(): number {
  return keptInThisPage.size;
}

export function readKeptDraft<T>(
  key: string,
  ownerId: number | null,
  nowMs = Date.now(),
): KeptDraft<T> | null {
  const store = browserStore();
  if (ownerId === null || !store) return null;
  const name = storageKey(ownerId, key);
  try {
    const raw = store.getItem(name);
    if (raw === null) return null;
    const parsed = JSON.parse(raw) as Partial<KeptDraft<T>> | null;
    const savedMs =
      parsed && typeof parsed.savedAt === 'string' ? Date.parse(parsed.savedAt) : Number.NaN;
    if (
      !parsed ||
      parsed.ownerId !== ownerId ||
      !Number.isFinite(savedMs) ||
      nowMs - savedMs > draftLifetimeMs ||
      !('values' in parsed)
    ) {
      store.removeItem(name);
      return null;
    }
    return parsed as KeptDraft<T>;
  } catch {
    return null;
  }
}

export function keepDraft<T>(key: string, ownerId: number, values: T, basis?: unknown): void {
  const name = storageKey(ownerId, key);
  try {
    browserStore()?.setItem(
      name,
      JSON.stringify({
        ownerId,
        savedAt: new Date().toISOString(),
        values,
        ...(basis === undefined ? {} : { basis }),
      } satisfies KeptDraft<T>),
    );
    noteKept(name, true);
  } catch {
    // Storage full or refused: the values still live in the page.
  }
}

export function dropDraft(key: string, ownerId: number | null): void {
  if (ownerId === null) return;
  const name = storageKey(ownerId, key);
  noteKept(name, false);
  try {
    browserStore()?.removeItem(name);
  } catch {
    // Nothing to drop.
  }
}

function dropWhere(store: Storage | null, drop: (name: string, raw: string | null) => boolean) {
  if (!store) return;
  try {
    for (const name of Object.keys(store))
      if (drop(name, store.getItem(name))) store.removeItem(name);
  } catch {
    // Nothing to drop.
  }
}

/** On sign-out: nothing one person typed stays for the next. */
export function dropAllDrafts(): void {
  const isDraft = (name: string) =>
    name.startsWith(prefix) || legacyPrefixes.some((p) => name.startsWith(p));
  dropWhere(browserStore(), isDraft);
  try {
    dropWhere(globalThis.sessionStorage ?? null, isDraft);
  } catch {
    // No session storage here.
  }
  for (const name of [...keptInThisPage]) noteKept(name, false);
}

/** At start: drafts past their lifetime go, whoever wrote them. */
export function dropExpiredDrafts(nowMs = Date.now()): void {
  dropWhere(browserStore(), (name, raw) => {
    if (!name.startsWith(prefix)) return false;
    try {
      const savedMs = Date.parse(
        (JSON.parse(raw ?? 'null') as { savedAt?: string } | null)?.savedAt ?? '',
      );
      return !Number.isFinite(savedMs) || nowMs - savedMs > draftLifetimeMs;
    } catch {
      return true;
    }
  });
}

/**
 * The one writer behind every kept draft: writes a short pause after the last change (a fast
 * typist does not write on every key), at once when the component goes away (a crash unmounts
 * it, so what was typed in the last pause is kept too), and never again for values a save or a
 * discard has already settled.
 */
function useDraftWriter<T>(key: string, ownerId: number | null, delayMs: number, basis?: unknown) {
  const basisRef = useRef(basis);
  useLayoutEffect(() => {
    basisRef.current = basis;
  }, [basis]);
  const pending = useRef<{ values: T } | null>(null);
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const settled = useRef<string | null>(null);

  const flush = useCallback(() => {
    clearTimeout(timer.current);
    const next = pending.current;
    pending.current = null;
    if (!next || ownerId === null) return;
    if (settled.current !== null && JSON.stringify(next.values) === settled.current) return;
    settled.current = null;
    keepDraft(key, ownerId, next.values, basisRef.current);
  }, [key, ownerId]);

  const schedule = useCallback(
    (values: T) => {
      pending.current = { values };
      clearTimeout(timer.current);
      timer.current = setTimeout(flush, delayMs);
    },
    [flush, delayMs],
  );

  /** Drops the kept copy; the values as they stand are not written again until they change. */
  const clear = useCallback(
    (current?: T) => {
      clearTimeout(timer.current);
      pending.current = null;
      settled.current = current === undefined ? null : JSON.stringify(current);
      dropDraft(key, ownerId);
    },
    [key, ownerId],
  );

  useEffect(() => flush, [flush]);
  return { schedule, flush, clear };
}

type WatchableForm<T> = {
  watch: (callback: (values: unknown) => void) => { unsubscribe: () => void };
  reset: (values: T, options?: { keepDefaultValues?: boolean }) => void;
  getValues?: () => unknown;
};

export type FormDraftControl<T> = {
  /** A draft left by an earlier page, waiting for the person to restore or discard it. */
  offered: KeptDraft<T> | null;
  restore: () => void;
  discard: () => void;
  /** After a save or a cancel: the kept copy has done its job. */
  clear: () => void;
};

/** The draft a form finds on load, offered until the person restores or discards it. */
function useOffer<T>(
  key: string,
  ownerId: number | null,
  wanted: (values: T) => boolean = () => true,
) {
  const [offered, setOffered] = useState<KeptDraft<T> | null>(() => {
    const kept = readKeptDraft<T>(key, ownerId);
    if (kept && wanted(kept.values)) {
      noteKept(storageKey(kept.ownerId, key), true);
      return kept;
    }
    return null;
  });
  // Read by the form's watcher, which runs outside render; kept in step once each render commits.
  const offeredRef = useRef(offered);
  useLayoutEffect(() => {
    offeredRef.current = offered;
  }, [offered]);
  return { offered, offeredRef, setOffered };
}

/**
 * Keeps a react-hook-form form's values as they are typed and, on the next load of the same form,
 * offers them back. While an offer is open nothing is written, so typing before answering it
 * cannot overwrite the kept draft.
 */
export function useFormDraft<T>(
  key: string,
  form: WatchableForm<T>,
  options: {
    settle?: (raw: unknown) => T;
    /** Kept with the values (e.g. the order version the form was read at), handed back on restore. */
    basis?: unknown;
    onRestore?: (basis: unknown) => void;
  } = {},
): FormDraftControl<T> {
  const ownerId = useCurrentPersonId();
  const { offered, offeredRef, setOffered } = useOffer<T>(key, ownerId);
  // The first settle function given is the one used, as the watcher subscribes once.
  const [settle] = useState(() => options.settle ?? ((raw: unknown) => raw as T));
  const onRestore = useRef(options.onRestore);
  useLayoutEffect(() => {
    onRestore.current = options.onRestore;
  }, [options.onRestore]);
  const { schedule, clear: clearWriter } = useDraftWriter<T>(key, ownerId, 200, options.basis);
  const { watch, reset, getValues } = form;

  useEffect(() => {
    const subscription = watch((values) => {
      if (!offeredRef.current) schedule(settle(values));
    });
    return () => subscription.unsubscribe();
  }, [watch, settle, schedule, offeredRef]);

  const restore = useCallback(() => {
    const draft = offeredRef.current;
    if (!draft) return;
    setOffered(null);
    onRestore.current?.(draft.basis);
    reset(settle(draft.values), { keepDefaultValues: true });
  }, [reset, settle, offeredRef, setOffered]);
  const discard = useCallback(() => {
    setOffered(null);
    clearWriter();
  }, [clearWriter, setOffered]);
  const clear = useCallback(
    () => clearWriter(getValues ? settle(getValues()) : undefined),
    [clearWriter, getValues, settle],
  );
  return { offered, restore, discard, clear };
}

/** The same for a form kept in plain React state; `differs` says whether there is anything to keep. */
export function useStateDraft<T>(
  key: string,
  current: T,
  setCurrent: (values: T) => void,
  differs: (values: T) => boolean,
): FormDraftControl<T> {
  const ownerId = useCurrentPersonId();
  const { offered, setOffered } = useOffer<T>(key, ownerId, differs);
  const { schedule, clear: clearWriter } = useDraftWriter<T>(key, ownerId, 200);
  const latest = useRef(current);
  useLayoutEffect(() => {
    latest.current = current;
  }, [current]);

  useEffect(() => {
    if (offered) return;
    if (differs(current)) schedule(current);
    else clearWriter();
  }, [offered, current, differs, schedule, clearWriter]);

  return {
    offered,
    restore: () => {
      if (!offered) return;
      setOffered(null);
      setCurrent(offered.values);
    },
    discard: () => {
      setOffered(null);
      clearWriter();
    },
    clear: () => clearWriter(latest.current),
  };
}

/**
 * State that comes back by itself after a reload (no offer): the step clock's ticks and typed
 * reasons on the way to a tap. A kept value of another shape than `initial` is not trusted.
 */
export function useKeptState<T>(key: string, initial: T): [T, (next: T) => void, () => void] {
  const ownerId = useCurrentPersonId();
  // The first `initial` given is the one a kept value is judged by and cleared back to.
  const [initialValue] = useState(initial);
  const [value, setValue] = useState<T>(() => {
    const kept = readKeptDraft<unknown>(key, ownerId)?.values;
    if (
      kept === undefined ||
      kept === null ||
      typeof kept !== typeof initialValue ||
      Array.isArray(kept) !== Array.isArray(initialValue)
    )
      return initialValue;
    if (typeof kept === 'object' && !Array.isArray(kept))
      return { ...initialValue, ...(kept as object) } as T;
    return kept as T;
  });
  const update = useCallback(
    (next: T) => {
      setValue(next);
      if (ownerId !== null) keepDraft(key, ownerId, next);
    },
    [key, ownerId],
  );
  const clear = useCallback(() => {
    setValue(initialValue);
    dropDraft(key, ownerId);
  }, [initialValue, key, ownerId]);
  return [value, update, clear];
}

/** Whether this page holds a kept draft, for the crash screens; read after the crashed form has gone. */
export function useDraftsKeptInThisPage(): boolean {
  const [kept, setKept] = useState(false);
  useEffect(() => {
    const update = () => setKept(draftsKeptInThisPage() > 0);
    update();
    keptListeners.add(update);
    return () => {
      keptListeners.delete(update);
    };
  }, []);
  return kept;
}

/** A settle function for flat forms: a kept draft over the form's defaults, so an older draft still fills every field. */
export function overDefaults<T extends object>(defaults: T): (raw: unknown) => T {
  return (raw) => {
    const kept = raw && typeof raw === 'object' ? (raw as Record<string, unknown>) : {};
    const merged: Record<string, unknown> = { ...(defaults as Record<string, unknown>) };
    // A kept value of another type than the default (an older form, a hand-edited store) is not trusted.
    for (const [name, fallback] of Object.entries(defaults))
      if (typeof kept[name] === typeof fallback) merged[name] = kept[name];
    return merged as T;
  };
}
