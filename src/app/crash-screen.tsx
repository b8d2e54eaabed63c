import { AlertIcon, ReloadIcon } from '../components/ui/icons-start';
import { buttonClasses } from '../components/ui/button';
import { KeptDraftNotice } from '../components/ui/kept-draft-notice';
import { StatusPanel } from '../components/ui/status-panel';
import { paths } from '../config/paths';
import { PlainPage } from './layout/plain-page';

/**
 * The last line of defence when the app itself fails outside any route. Plain links and a
 * reload, because the router may be what broke.
 */
export function CrashScreen() {
  return (
    <PlainPage>
      <StatusPanel
        role="alert"
        headingLevel="h1"
        icon={<AlertIcon className="size-6" />}
        title="Luxtempo stopped unexpectedly"
        actions={
          <>
            <button
              type="button"
              className={buttonClasses('primary')}
              onClick={() => window.location.reload()}
            >
              <ReloadIcon />
              Reload the page
            </button>
            <a href={paths.today.getHref()} className={buttonClasses('secondary')}>
              Go to Today
            </a>
          </>
        }
      >
        <p>
          Anything already saved is kept. Reload to carry on; if it happens again, tell your
          unit&rsquo;s administrator.
        </p>
        <KeptDraftNotice />
      </StatusPanel>
    </PlainPage>
  );
}
