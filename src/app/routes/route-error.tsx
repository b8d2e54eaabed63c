import { Button, LinkButton } from '../../components/ui/button';
import { AlertIcon, ArrowLeftIcon, ReloadIcon } from '../../components/ui/icons-start';
import { KeptDraftNotice } from '../../components/ui/kept-draft-notice';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { PlainPage } from '../layout/plain-page';

/**
 * Shown when a screen fails to load or render (src/app/router.tsx). It never shows the error
 * itself (a stack trace helps nobody at the bedside); the error boundary logs it to the browser
 * console. An unknown address has a screen of its own (./not-found.tsx).
 */
export function RouteErrorScreen({ framed }: { framed: boolean }) {
  const panel = (
    <>
      <title>Screen unavailable · Luxtempo</title>
      <StatusPanel
        role="alert"
        headingLevel="h1"
        icon={<AlertIcon className="size-6" />}
        title="This screen could not be shown"
        actions={
          <>
            <Button icon={<ReloadIcon />} onClick={() => window.location.reload()}>
              Reload the page
            </Button>
            <LinkButton to={paths.today.getHref()} icon={<ArrowLeftIcon />} reloadDocument>
              Go to Today
            </LinkButton>
          </>
        }
      >
        <p>
          Something went wrong while opening it. Reloading usually helps; anything already saved is
          kept. If it happens again, tell your unit&rsquo;s administrator what you were doing.
        </p>
        <KeptDraftNotice />
      </StatusPanel>
    </>
  );

  return framed ? <PlainPage>{panel}</PlainPage> : panel;
}
