import '@fontsource/lexend/400.css';
import '@fontsource/lexend/500.css';
import '@fontsource/lexend/600.css';
import '@fontsource/lexend/700.css';
import './index.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './app';
import { applyServerTimeZone } from './config/unit-time-zone';
import { takeUpdatesWhenIdle } from './lib/app-update';
import { currentPersonId } from './lib/current-person';
import { dropExpiredDrafts } from './lib/form-draft';

/** Whether this tablet still holds taps of the person signed in (a new version waits for them). */
async function unsentTapsOfPersonSignedIn(): Promise<number> {
  const person = currentPersonId();
  if (person === null) return 0;
  // The tap store (IndexedDB and the session schemas) loads only when a new version asks.
  const { ordersWithUnsentTapsOf } = await import('./features/step-clock/api/tap-store');
  return (await ordersWithUnsentTapsOf(person)).length;
}

const container = document.getElementById('root');
if (!container) throw new Error('index.html must contain <div id="root">');

/** The unit's settings that every screen formats with; a failure leaves the built-in defaults. */
async function loadUnitSettings(): Promise<void> {
  try {
    const res = await fetch('/api/unit', { signal: AbortSignal.timeout(3000) });
    if (res.ok) {
      const unit = (await res.json()) as { timeZone: string; locale?: string };
      applyServerTimeZone(unit.timeZone, unit.locale);
    }
  } catch {
    // The sign-in page will say so if the server is not answering.
  }
}

// Unsaved drafts older than their lifetime go before anything can offer them.
dropExpiredDrafts();

// The service worker (src/sw.ts) lets the clock open without network; the dev server has none.
if (import.meta.env.PROD && 'serviceWorker' in navigator) {
  void navigator.serviceWorker
    .register('/sw.js', { scope: '/' })
    .then((registration) => takeUpdatesWhenIdle(registration, unsentTapsOfPersonSignedIn))
    .catch(() => undefined);
  // Fetched before the worker took over, the unit's settings were not kept: ask again through it
  // (the provider does the same for the step clock's own answers).
  navigator.serviceWorker.addEventListener('controllerchange', () => {
    if (navigator.onLine) void loadUnitSettings();
  });
}

void loadUnitSettings().then(() =>
  createRoot(container).render(
    <StrictMode>
      <App />
    </StrictMode>,
  ),
);
