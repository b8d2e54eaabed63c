import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import { Navigate, useSearchParams } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { Button } from '../../components/ui/button';
import { LockIcon, MarkIcon, ReloadIcon } from '../../components/ui/icons-start';
import { LoadingPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { authQueries } from '../../features/auth/api/auth-queries';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { useSession } from '../../features/auth/hooks/use-session';
import { describeError } from '../../lib/api-client';
import { safeRedirectTarget } from '../../lib/redirect-target';
import { readWhySessionEnded } from '../../lib/session-ended';

export function SignInRoute() {
  const session = useSession();
  const queryClient = useQueryClient();
  const [searchParams] = useSearchParams();
  // Said on the sign-in page until someone signs in (or signs out on purpose): kept in the tab,
  // so a screen that mounts the page twice while it loads still says it.
  const [whyEnded] = useState(readWhySessionEnded);
  const wanted = safeRedirectTarget(searchParams.get('redirectTo'));
  // Never bounce back to the sign-in page itself, which would loop once signed in.
  const redirectTo = wanted && !wanted.startsWith(paths.signIn.path) ? wanted : null;

  // Whoever signs in next must not see data cached for the last person (their session may have
  // simply run out on this tablet).
  useEffect(() => {
    queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== authQueries.all()[0] });
  }, [queryClient]);

  // Signed in already, or just now: go where the person was heading.
  if (session.data) return <Navigate to={redirectTo ?? paths.today.getHref()} replace />;

  return (
    <div className="flex min-h-dvh flex-col bg-paper-50 md:flex-row">
      <title>Sign in · Luxtempo</title>
      <header className="flex flex-col justify-between gap-10 border-b border-paper-200 bg-paper-100 px-8 py-10 md:w-[42%] md:border-r md:border-b-0 md:px-12 md:py-14">
        <div className="space-y-6">
          <div className="flex items-center gap-3">
            <MarkIcon className="size-11" />
            <span className="text-3xl font-semibold tracking-tight text-paper-950">Luxtempo</span>
          </div>
          <p className="max-w-md text-lg leading-relaxed text-paper-800">
            Plans, double-checks, times and records verteporfin photodynamic therapy and
            riboflavin/UVA corneal cross-linking for the eye unit.
          </p>
        </div>
        <LightSweep />
        <p className="flex max-w-md items-start gap-2 text-sm text-paper-700">
          <LockIcon className="mt-0.5 size-4" />
          <span>
            For authorised staff of the eye unit only. Your unit&rsquo;s administrator sets up
            accounts.
          </span>
        </p>
      </header>

      <main
        id="main-content"
        tabIndex={-1}
        className="flex flex-1 items-center justify-center px-6 py-12"
      >
        <div className="w-full max-w-sm space-y-6">
          {session.isPending ? (
            <LoadingPanel label="Checking whether you are signed in…" />
          ) : (
            <>
              {session.isError && (
                <Alert tone="error" title="Luxtempo’s server is not answering" live="status">
                  <p>{describeError(session.error)}</p>
                  <p className="mt-1">Signing in will work again once it is back.</p>
                  <Button
                    variant="secondary"
                    size="sm"
                    className="mt-3"
                    icon={<ReloadIcon className="size-4" />}
                    busy={session.isFetching}
                    onClick={() => void session.refetch()}
                  >
                    Check again
                  </Button>
                </Alert>
              )}
              {whyEnded && !session.isError && (
                <Alert tone="info" title="You were signed out" live="status">
                  {whyEnded}
                </Alert>
              )}
              {redirectTo && !session.isError && !whyEnded && (
                <Alert tone="info" live="none">
                  Sign in to open the page you asked for.
                </Alert>
              )}
              <div className="rounded-2xl border border-paper-200 bg-white p-6 shadow-sm">
                <SignInForm />
              </div>
            </>
          )}
        </div>
      </main>
    </div>
  );
}

/** A quiet drawing of the mark's idea: a lens ringed by the sweep of a timer. Decorative only. */
function LightSweep() {
  return (
    <svg
      viewBox="0 0 240 120"
      aria-hidden="true"
      focusable="false"
      className="hidden w-full max-w-xs text-iris-300 md:block"
    >
      <g fill="none" stroke="currentColor" strokeWidth="1.5">
        <circle cx="60" cy="60" r="52" opacity="0.35" />
        <circle cx="60" cy="60" r="38" opacity="0.6" />
        <circle cx="60" cy="60" r="22" />
        <path d="M60 8a52 52 0 0 1 52 52" strokeWidth="5" stroke="#6139ad" strokeLinecap="round" />
        <path d="M120 60h110" strokeDasharray="2 8" strokeLinecap="round" />
      </g>
      <circle cx="60" cy="60" r="6" fill="#512c95" />
    </svg>
  );
}
