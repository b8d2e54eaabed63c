import type { ReactNode } from 'react';
import { useParams } from 'react-router-dom';
import type { Capability } from '../../../shared/roles';
import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { ListsScreen } from '../../features/lists/components/lists-screen';
import { VialPlanScreen } from '../../features/lists/components/vial-plan-screen';
import { useSignedInUser } from '../layout/signed-in-user';

/** A screen for holders of one capability; others are told whose it is. */
export function Gate({
  capability,
  title,
  lockedTitle,
  children,
}: {
  capability: Capability;
  title: string;
  lockedTitle: string;
  children: ReactNode;
}) {
  const user = useSignedInUser();
  return (
    <>
      <title>{`${title} · Luxtempo`}</title>
      {hasCapability(user, capability) ? (
        children
      ) : (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title={lockedTitle}
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>Ask an administrator if your roles need to change.</p>
        </StatusPanel>
      )}
    </>
  );
}

export function ListsRoute() {
  const user = useSignedInUser();
  return (
    <Gate
      capability="lists.read"
      title="Treatment lists"
      lockedTitle="Treatment lists are not part of your roles"
    >
      <ListsScreen
        canManage={hasCapability(user, 'lists.manage')}
        canSeeVialPlan={hasCapability(user, 'stock.read')}
      />
    </Gate>
  );
}

export function VialPlanRoute() {
  const { id = '' } = useParams();
  const listId = /^\d+$/.test(id) ? Number(id) : null;
  return (
    <Gate capability="stock.read" title="Vial plan" lockedTitle="Vial plans are for the pharmacy">
      {listId === null ? (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="There is no such list"
        >
          <p>The address names no list.</p>
        </StatusPanel>
      ) : (
        <VialPlanScreen listId={listId} />
      )}
    </Gate>
  );
}
