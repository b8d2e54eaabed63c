import { useLocation } from 'react-router-dom';
import { LinkButton } from '../../components/ui/button';
import { ArrowLeftIcon, InfoIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { PlainPage } from '../layout/plain-page';

export function NotFoundRoute() {
  const { pathname } = useLocation();
  return (
    <PlainPage>
      <title>Page not found · Luxtempo</title>
      <StatusPanel
        headingLevel="h1"
        icon={<InfoIcon className="size-6" />}
        title="There is no page here"
        actions={
          <LinkButton variant="primary" to={paths.today.getHref()} icon={<ArrowLeftIcon />}>
            Go to Today
          </LinkButton>
        }
      >
        <p>
          Nothing in Luxtempo lives at{' '}
          <code className="rounded bg-paper-100 px-1.5 py-0.5 text-sm break-all">{pathname}</code>.
          The link may be mistyped or out of date.
        </p>
      </StatusPanel>
    </PlainPage>
  );
}
