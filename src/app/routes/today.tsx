import { hasCapability } from '../../features/auth/hooks/use-session';
import { OverdueVisits } from '../../features/follow-up/components/overdue-visits';
import { TodayOverview } from '../../features/today/components/today-overview';
import { useSignedInUser } from '../layout/signed-in-user';

export function TodayRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Today · Luxtempo</title>
      <TodayOverview displayName={user.displayName} roles={user.roles} />
      {hasCapability(user, 'follow-up.record') && <OverdueVisits />}
    </>
  );
}
