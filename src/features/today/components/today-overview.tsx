import type { Role } from '../../../../shared/roles';
import { InfoIcon } from '../../../components/ui/icons';
import { RoleDutiesList } from './role-duties-list';

type TodayOverviewProps = {
  displayName: string;
  roles: readonly Role[];
};

function greetingFor(hour: number): string {
  if (hour < 12) return 'Good morning';
  if (hour < 18) return 'Good afternoon';
  return 'Good evening';
}

export function TodayOverview({ displayName, roles }: TodayOverviewProps) {
  const now = new Date();
  const dateLine = new Intl.DateTimeFormat('en-GB', { weekday: 'long', day: 'numeric', month: 'long', year: 'numeric' }).format(now);

  return (
    <div className="space-y-8">
      <div className="mb-6 border-b border-paper-200 pb-5">
        <p className="text-sm font-medium uppercase tracking-wider text-paper-600">
          <span className="sr-only">Today, </span>
          {dateLine}
        </p>
        <h1 tabIndex={-1} data-page-heading className="mt-1 text-3xl font-semibold tracking-tight text-paper-950">
          {greetingFor(now.getHours())}, {displayName}
        </h1>
      </div>

      <section aria-labelledby="today-roles-heading" className="space-y-3">
        <h2 id="today-roles-heading" className="text-xl font-semibold text-paper-900">
          {roles.length === 1 ? 'Your role' : 'Your roles'}
        </h2>
        <RoleDutiesList roles={roles} />
      </section>

      <section aria-labelledby="today-worklist-heading" className="space-y-3">
        <h2 id="today-worklist-heading" className="text-xl font-semibold text-paper-900">
          Your worklist
        </h2>
        <div className="flex gap-3 rounded-xl border border-dashed border-paper-400 bg-paper-100 px-5 py-4 text-paper-800">
          <InfoIcon className="mt-0.5 size-5 text-paper-700" />
          <p>
            Treatment orders are not handled in Luxtempo yet, so there is nothing to list here. Orders, dose checks and sessions
            waiting for you will appear on this page once they are.
          </p>
        </div>
      </section>
    </div>
  );
}
