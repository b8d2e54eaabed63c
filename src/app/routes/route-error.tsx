import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { Button, LinkButton } from '../../components/ui/button';
import { AlertIcon, ArrowLeftIcon, ReloadIcon } from '../../components/ui/icons';
import { KeptDraftNotice } from '../../components/ui/kept-draft-notice';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { PlainPage } from '../layout/plain-page';

/**
 * Shown when a screen fails to load or render. It never shows the error itself (a stack trace
 * helps nobody at the bedside); the router already logs it to the browser console.
 */
export function RouteErrorScreen({ framed }: { framed: boolean }) {
  const error = useRouteError();
  const missing = isRouteErrorResponse(error) && error.status === 404;

  const panel = (
    <>
      <title>Screen unavailable · Luxtempo</title>
      <StatusPanel
        role="alert"
        headingLevel="h1"
        icon={<AlertIcon className="size-6" />}
        title={missing ? 'There is no page here' : 'This screen could not be shown'}
        actions={
          <>
            {!missing && (
              <Button icon={<ReloadIcon />} onClick={() => window.location.reload()}>
                Reload the page
              </Button>
            )}
            <LinkButton to={paths.today.getHref()} icon={<ArrowLeftIcon />} reloadDocument>
              Go to Today
            </LinkButton>
          </>
        }
      >
        {missing ? (
          <p>The link may be mistyped or out of date.</p>
        ) : (
          <>
            <p>
              Something went wrong while opening it. Reloading usually helps; anything already saved
              is kept. If it happens again, tell your unit&rsquo;s administrator what you were
              doing.
            </p>
            <KeptDraftNotice />
          </>
        )}
      </StatusPanel>
    </>
  );

  return framed ? <PlainPage>{panel}</PlainPage> : panel;
}
