import { useParams } from 'react-router-dom';
import { LinkButton } from '../../components/ui/button';
import { AlertIcon, LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { DeviationReviewScreen } from '../../features/deviations/components/deviation-review-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function DeviationReviewRoute() {
  const user = useSignedInUser();
  const { id } = useParams();
  const deviationId = id && /^[1-9]\d{0,9}$/.test(id) ? Number(id) : null;
  return (
    <>
      <title>{deviationId ? `Deviation ${deviationId} · Luxtempo` : 'Deviation · Luxtempo'}</title>
      {!hasCapability(user, 'audit.read') ? (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="Deviations are for auditors"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>Ask an administrator if your roles need to change.</p>
        </StatusPanel>
      ) : deviationId === null ? (
        <StatusPanel
          headingLevel="h1"
          icon={<AlertIcon className="size-6" />}
          title="There is no such deviation"
          actions={<LinkButton to={paths.deviations.getHref()}>All deviations</LinkButton>}
        >
          <p>“{id ?? ''}” is not a deviation number; they are whole numbers from 1.</p>
        </StatusPanel>
      ) : (
        // A new deviation starts with a fresh screen (no message left from the last one).
        <DeviationReviewScreen
          key={deviationId}
          deviationId={deviationId}
          userId={user.id}
          mayReview={hasCapability(user, 'audit.review')}
        />
      )}
    </>
  );
}
