import { createContext, useCallback, useContext, useEffect, useRef, useState } from 'react';

/**
 * What a long form has typed, kept in this browser tab (sessionStorage) until it is saved, so that a
 * crash or a reload never loses it. sessionStorage rather than localStorage: it survives a reload
 * of the tab but not its closing, so patient details do not linger on a shared ward computer.
 * Each draft names the person who typed it; another person signed in on the same tab is not
 * offered it, and signing out clears every draft.
 */
export type KeptDraft<T> = { ownerId: number; savedAt: string; values: T };

const prefix = 'luxtempo.form-draft.';

/** The signed-in person's id, provided by the authenticated layout. */
export const DraftOwnerContext = createContext<number | null>(null);

export function readKeptDraft<T>(key: string, ownerId: number | null): KeptDraft<T> | null {
  if (ownerId === null) return null;
  try {
    const raw = sessionStorage.getItem(prefix + key);
    if (raw === null) return null;
    const parsed = JSON.parse(raw) as KeptDraft<T>;
    return parsed && parsed.ownerId === ownerId && typeof parsed.savedAt === 'string' ? parsed : null;
  } catch {
    return null;
  }
}

export function keepDraft<T>(key: string, ownerId: number, values: T): void {
  try {
    sessionStorage.setItem(prefix + key, JSON.stringify({ ownerId, savedAt: new Date().toISOString(), values } satisfies KeptDraft<T>));
  } catch {
    // Storage full or refused: the values still live in the page.
  }
}

export function dropDraft(key: string): void {
  try {
    sessionStorage.removeItem(prefix + key);
  } catch {
    // Nothing to drop.
  }
}

/** On sign-out: nothing one person typed stays for the next. */
export function dropAllDrafts(): void {
  try {
    for (const key of Object.keys(sessionStorage)) if (key.startsWith(prefix)) sessionStorage.removeItem(key);
  } catch {
    // Nothing to drop.
  }
}

type WatchableForm<T> = {
  watch: (callback: (values: unknown) => void) => { unsubscribe: () => void };
  reset: (values: T, options?: { keepDefaultValues?: boolean }) => void;
};

export type FormDraftControl<T> = {
  /** A draft left by an earlier page of this tab, waiting for the person to restore or discard it. */
  offered: KeptDraft<T> | null;
  restore: () => void;
  discard: () => void;
  /** After a save: the kept copy has done its job. */
  clear: () => void;
};

/**
 * Keeps a react-hook-form form's values as they are typed and, on the next load of the same form,
 * offers them back. While an offer is open nothing is written, so typing before answering it
 * cannot overwrite the kept draft.
 */
export function useFormDraft<T>(key: string, form: WatchableForm<T>, options: { settle?: (raw: unknown) => T } = {}): FormDraftControl<T> {
  const ownerId = useContext(DraftOwnerContext);
  const [offered, setOffered] = useState<KeptDraft<T> | null>(() => readKeptDraft<T>(key, ownerId));
  const offeredRef = useRef(offered);
  offeredRef.current = offered;
  const settle = useRef(options.settle).current;
  const { watch, reset } = form;

  useEffect(() => {
    if (ownerId === null) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const subscription = watch((values) => {
      if (offeredRef.current) return;
      clearTimeout(timer);
      // A short pause so a fast typist does not write on every key; a crash mid-pause loses at most that.
      timer = setTimeout(() => keepDraft(key, ownerId, settle ? settle(values) : (values as T)), 200);
    });
    return () => {
      clearTimeout(timer);
      subscription.unsubscribe();
    };
  }, [key, ownerId, watch, settle]);

  const restore = useCallback(() => {
    const draft = offeredRef.current;
    if (!draft) return;
    setOffered(null);
    reset(settle ? settle(draft.values) : draft.values, { keepDefaultValues: true });
  }, [reset, settle]);
  const discard = useCallback(() => {
    setOffered(null);
    dropDraft(key);
  }, [key]);
  const clear = useCallback(() => dropDraft(key), [key]);
  return { offered, restore, discard, clear };
}

/** The same for a form kept in plain React state. */
export function useStateDraft<T>(key: string, current: T, setCurrent: (values: T) => void, differs: (values: T) => boolean): FormDraftControl<T> {
  const ownerId = useContext(DraftOwnerContext);
  const [offered, setOffered] = useState<KeptDraft<T> | null>(() => {
    const kept = readKeptDraft<T>(key, ownerId);
    return kept && differs(kept.values) ? kept : null;
  });
  useEffect(() => {
    if (ownerId === null || offered) return;
    const timer = setTimeout(() => (differs(current) ? keepDraft(key, ownerId, current) : dropDraft(key)), 200);
    return () => clearTimeout(timer);
  }, [key, ownerId, offered, current, differs]);
  return {
    offered,
    restore: () => {
      if (!offered) return;
      setOffered(null);
      setCurrent(offered.values);
    },
    discard: () => {
      setOffered(null);
      dropDraft(key);
    },
    clear: () => dropDraft(key),
  };
}

/** A settle function for flat forms: a kept draft over the form's defaults, so an older draft still fills every field. */
export function overDefaults<T extends object>(defaults: T): (raw: unknown) => T {
  return (raw) => ({ ...defaults, ...(raw && typeof raw === 'object' ? (raw as Partial<T>) : {}) });
}
