import { Suspense, useEffect, useRef } from 'react';
import { Outlet, useLocation } from 'react-router-dom';
import type { SessionUser } from '../../../shared/schemas/auth';
import { LoadingPanel } from '../../components/ui/status-panel';
import { setCurrentPersonId } from '../../lib/current-person';
import { AppHeader } from './app-header';
import { MainNav } from './main-nav';
import type { ShellContext } from './signed-in-user';

export function AppShell({ user }: { user: SessionUser }) {
  const mainRef = useRef<HTMLElement>(null);
  const { pathname } = useLocation();
  const firstRender = useRef(true);

  // After moving to another screen, start keyboard and screen-reader users at its heading
  // instead of leaving focus on the link they pressed.
  useEffect(() => {
    if (firstRender.current) {
      firstRender.current = false;
      return;
    }
    const heading = mainRef.current?.querySelector<HTMLElement>('[data-page-heading]');
    (heading ?? mainRef.current)?.focus();
  }, [pathname]);

  // Set while rendering, before any screen's effect could queue or send work for the person, and
  // before any form looks for the person's kept drafts (src/lib/current-person.ts).
  setCurrentPersonId(user.id);
  const context: ShellContext = { user };

  return (
    <>
      <div className="flex min-h-dvh flex-col bg-paper-50">
        <a
          href="#main-content"
          className="sr-only rounded-lg bg-iris-700 font-medium text-white shadow-lg focus:not-sr-only focus:absolute focus:top-3 focus:left-3 focus:z-50 focus:px-4 focus:py-2"
        >
          Skip to main content
        </a>
        <AppHeader user={user} />
        {/* Landscape tablets get the navigation as a bar under the header so tables keep their width;
            wide desktop screens get a side rail. */}
        <div className="flex flex-1 flex-col xl:flex-row">
          <div className="border-b border-paper-200 bg-paper-100 px-4 py-2 xl:w-56 xl:shrink-0 xl:border-r xl:border-b-0 xl:px-3 xl:py-5 print:hidden">
            <MainNav user={user} />
          </div>
          <main
            id="main-content"
            ref={mainRef}
            tabIndex={-1}
            className="min-w-0 flex-1 px-6 py-8 xl:px-10 print:p-0"
          >
            <div className="mx-auto max-w-6xl">
              {/* Stays in place between screens, so the screen on show stays until the next has loaded. */}
              <Suspense fallback={<LoadingPanel label="Opening the screen…" />}>
                <Outlet context={context} />
              </Suspense>
            </div>
          </main>
        </div>
      </div>
    </>
  );
}
