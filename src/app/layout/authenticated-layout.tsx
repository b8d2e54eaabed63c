import { Navigate, useLocation } from 'react-router-dom';
import { Button } from '../../components/ui/button';
import { PlugOffIcon, ReloadIcon } from '../../components/ui/icons-first';
import { LoadingPanel, StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { useSession } from '../../features/auth/hooks/use-session';
import { describeError } from '../../lib/api-client';
import { AppShell } from './app-shell';
import { PlainPage } from './plain-page';

/**
 * Every signed-in screen sits under this route. Without a session it sends the person to sign
 * in and remembers where they were heading; if the session cannot be checked it says so.
 */
export function AuthenticatedLayout() {
  const session = useSession();
  const location = useLocation();

  if (session.data) return <AppShell user={session.data} />;

  if (session.data === null) {
    const wanted = `${location.pathname}${location.search}${location.hash}`;
    return <Navigate to={paths.signIn.getHref(wanted)} replace />;
  }

  if (session.isError) {
    return (
      <PlainPage>
        <title>Cannot reach the server · Luxtempo</title>
        <StatusPanel
          role="alert"
          headingLevel="h1"
          icon={<PlugOffIcon className="size-6" />}
          title="Luxtempo cannot check your sign-in"
          actions={
            <Button
              variant="primary"
              icon={<ReloadIcon />}
              busy={session.isFetching}
              onClick={() => void session.refetch()}
            >
              Try again
            </Button>
          }
        >
          <p>{describeError(session.error)}</p>
        </StatusPanel>
      </PlainPage>
    );
  }

  return (
    <PlainPage>
      <LoadingPanel label="Checking your sign-in…" />
    </PlainPage>
  );
}
