import type { ReactNode } from 'react';
import { MarkIcon } from '../../components/ui/icons-start';

/**
 * The frame for screens shown without the signed-in navigation: starting up, not found,
 * a failed check of the session. Keeps the product mark so the person knows where they are.
 */
export function PlainPage({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col bg-paper-50">
      <header className="flex items-center gap-3 border-b border-paper-200 bg-paper-100 px-6 py-3">
        <MarkIcon className="size-8" />
        <span className="text-lg font-semibold tracking-tight text-paper-950">Luxtempo</span>
      </header>
      <main id="main-content" tabIndex={-1} className="flex-1 px-6 py-12">
        {children}
      </main>
    </div>
  );
}
