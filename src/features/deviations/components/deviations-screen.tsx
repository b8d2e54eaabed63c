import { useQuery } from '@tanstack/react-query';
import { Alert } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { AlertIcon, CheckCircleIcon, FileDownloadIcon, ReloadIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { deviationQueries } from '../api/deviation-queries';
import { deviationsCsvHref } from '../api/get-deviations';
import { toAuditFilter, useDeviationListParams } from '../hooks/use-deviation-list-params';
import { DeviationFilters } from './deviation-filters';
import { DeviationsTable } from './deviations-table';

/** Server problems with the filter, by parameter (a 400's `fields`). */
function filterProblems(error: unknown): Record<string, string> {
  if (!isApiRequestError(error) || error.status !== 400) return {};
  return Object.fromEntries(error.fields.map((f) => [f.path.split('.')[0] ?? f.path, f.message]));
}

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
      <DeviationFilters params={params} filtered={filtered} fieldErrors={fieldErrors} onChange={update} />

      {list.isPending ? (
        <LoadingPanel label="Loading deviations…" />
      ) : list.isError && !list.data ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title={Object.keys(fieldErrors).length > 0 ? 'The server refused this filter' : 'The deviations could not be loaded'}
          actions={
            <Button variant="secondary" icon={<ReloadIcon />} busy={list.isFetching} onClick={() => void list.refetch()}>
              Try again
            </Button>
          }
        >
          <p>{Object.keys(fieldErrors).length > 0 ? 'Correct the filters marked above.' : describeError(list.error)}</p>
        </StatusPanel>
      ) : list.data.total === 0 ? (
        <StatusPanel icon={<CheckCircleIcon className="size-6" />} title={filtered ? 'No deviation matches these filters' : 'No open deviations'}>
          <p>{filtered ? 'Widen the dates or clear the filters.' : 'Every deviation found so far has been reviewed. New ones appear here as sessions end.'}</p>
        </StatusPanel>
      ) : (
        <>
          {list.isError && (
            <Alert tone="error" title="The queue may be out of date" className="mb-4">
              {describeError(list.error)}
            </Alert>
          )}
          <DeviationsTable rows={list.data.deviations} total={list.data.total} params={params} queueSearch={search} onChange={update} busy={list.isPlaceholderData} />
        </>
      )}
    </>
  );
}
