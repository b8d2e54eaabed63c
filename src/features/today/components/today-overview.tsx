import { useQuery } from '@tanstack/react-query';
import { DateTime } from 'luxon';
import { formatUnitTime } from '../../../../shared/format/figures';
import type { Role } from '../../../../shared/roles';
import { Button } from '../../../components/ui/button';
import { AlertIcon, InfoIcon, ReloadIcon } from '../../../components/ui/icons-first';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError } from '../../../lib/api-client';
import { todayQueries } from '../api/today-queries';
import { RoleDutiesList } from './role-duties-list';
import { TodayTreatmentLists } from './today-treatment-lists';
import { WorklistSection } from './worklist-section';

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
  // The unit's clock, not the device's: a tablet set to another zone still greets the ward's day.
  const now = DateTime.now().setZone(unitTimeZone);
  const dateLine = formatUnitTime(now.toISO(), unitTimeZone, 'day');
  const today = useQuery(todayQueries.worklists());

  return (
    <div className="space-y-8">
      <div className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-paper-200 pb-5">
        <div>
          <p className="text-sm font-medium uppercase tracking-wider text-paper-600">
            <span className="sr-only">Today, </span>
            {dateLine}
          </p>
          <h1
            tabIndex={-1}
            data-page-heading
            className="mt-1 text-3xl font-semibold tracking-tight text-paper-950"
          >
            {greetingFor(now.hour)}, {displayName}
          </h1>
        </div>
        <Button
          variant="secondary"
          icon={<ReloadIcon />}
          busy={today.isFetching && !today.isPending}
          onClick={() => void today.refetch()}
        >
          Refresh
        </Button>
      </div>

      {today.data && (roles.includes('nurse') || roles.includes('pharmacist')) && (
        <TodayTreatmentLists
          lists={today.data.treatmentLists}
          clockOffsetMs={today.data.clockOffsetMs}
          pharmacist={roles.includes('pharmacist')}
          nurse={roles.includes('nurse')}
        />
      )}

      <section aria-labelledby="today-worklist-heading" className="space-y-5">
        <h2 id="today-worklist-heading" className="text-xl font-semibold text-paper-900">
          Your worklists
        </h2>
        {today.isPending ? (
          <LoadingPanel label="Loading your worklists…" />
        ) : today.isError && !today.data ? (
          <StatusPanel
            role="alert"
            icon={<AlertIcon className="size-6" />}
            title="Your worklists could not be loaded"
            actions={
              <Button
                variant="secondary"
                icon={<ReloadIcon />}
                busy={today.isFetching}
                onClick={() => void today.refetch()}
              >
                Try again
              </Button>
            }
          >
            <p>{describeError(today.error)}</p>
          </StatusPanel>
        ) : today.data.lists.length === 0 ? (
          <div className="flex gap-3 rounded-xl border border-dashed border-paper-400 bg-paper-100 px-5 py-4 text-paper-800">
            <InfoIcon className="mt-0.5 size-5 text-paper-700" />
            <p>
              Your roles have no worklist on this page: there are no orders for you to act on here.
            </p>
          </div>
        ) : (
          <>
            {today.isError && (
              <p
                role="alert"
                className="flex items-center gap-2 rounded-lg border border-alarm-700 bg-alarm-50 px-4 py-3 text-alarm-800"
              >
                <AlertIcon className="size-5" />
                The lists may be out of date: {describeError(today.error)}
              </p>
            )}
            {today.data.lists.map((list) => (
              <WorklistSection key={list.id} list={list} clockOffsetMs={today.data.clockOffsetMs} />
            ))}
          </>
        )}
      </section>

      <section aria-labelledby="today-roles-heading" className="space-y-3">
        <h2 id="today-roles-heading" className="text-xl font-semibold text-paper-900">
          {roles.length === 1 ? 'Your role' : 'Your roles'}
        </h2>
        <RoleDutiesList roles={roles} />
      </section>
    </div>
  );
}
