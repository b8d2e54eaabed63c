import { useQuery } from '@tanstack/react-query';
import { buttonClasses } from '../../../components/ui/button';
import { FilteredListStates, filterProblems } from '../../../components/ui/filtered-list-states';
import { CheckCircleIcon, FileDownloadIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { deviationQueries } from '../api/deviation-queries';
import { deviationsCsvHref } from '../api/get-deviations';
import { toAuditFilter, useDeviationListParams } from '../hooks/use-deviation-list-params';
import { DeviationFilters } from './deviation-filters';
import { DeviationsTable } from './deviations-table';

/** Server problems with the filter, by parameter (a 400's `fields`). */
export function DeviationsScreen() {
  const { params, update, filtered, search } = useDeviationListParams();
  const filter = toAuditFilter(params);
  const list = useQuery(deviationQueries.list(filter));
  const fieldErrors = filterProblems(list.error);
  const csvHref = deviationsCsvHref(filter);

  return (
    <>
      <PageHeader
        title="Deviations"
        lead={`Every departure from protocol that the server found in a session, for review. The queue shows open deviations, newest first, unless you filter or sort otherwise. Times are in the unit’s time zone (${unitTimeZone}).`}
        actions={
          <a href={csvHref} download className={buttonClasses('secondary')}>
            <FileDownloadIcon />
            Download CSV
            <span className="sr-only"> of the deviations this filter matches</span>
          </a>
        }
      />
      <DeviationFilters
        params={params}
        filtered={filtered}
        fieldErrors={fieldErrors}
        onChange={update}
      />

      <FilteredListStates
        list={list}
        refused={Object.keys(fieldErrors).length > 0}
        words={{
          loading: 'Loading deviations…',
          failed: 'The deviations could not be loaded',
          stale: 'The queue may be out of date',
        }}
        empty={{
          icon: <CheckCircleIcon className="size-6" />,
          title: filtered ? 'No deviation matches these filters' : 'No open deviations',
          body: filtered
            ? 'Widen the dates or clear the filters.'
            : 'Every deviation found so far has been reviewed. New ones appear here as sessions end.',
        }}
      >
        {(data) => (
          <DeviationsTable
            rows={data.deviations}
            total={data.total}
            params={params}
            queueSearch={search}
            onChange={update}
            busy={list.isPlaceholderData}
          />
        )}
      </FilteredListStates>
    </>
  );
}
