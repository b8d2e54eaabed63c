import { useQuery } from '@tanstack/react-query';
import { useCallback } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { AlertIcon, FileDownloadIcon, RecordLedgerIcon, ReloadIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { doseRecordQueries } from '../api/dose-record-queries';
import { doseRecordsCsvHref } from '../api/get-dose-records';
import { useDoseRecordListParams } from '../hooks/use-dose-record-list-params';
import { DoseRecordFilters } from './dose-record-filters';
import { DoseRecordsTable } from './dose-records-table';

function filterProblems(error: unknown): Record<string, string> {
  if (!isApiRequestError(error) || error.status !== 400) return {};
  return Object.fromEntries(error.fields.map((f) => [f.path.split('.')[0] ?? f.path, f.message]));
}

export function DoseRecordsScreen() {
  const { filter, update, filtered } = useDoseRecordListParams();
  const list = useQuery(doseRecordQueries.list(filter));
  const protocols = useQuery(doseRecordQueries.protocolChoices());
  const fieldErrors = filterProblems(list.error);
  const titles = protocols.data;
  const protocolTitle = useCallback((key: string) => titles?.find((p) => p.key === key)?.title ?? key, [titles]);

  return (
    <>
      <PageHeader
        title="Dose records"
        lead={`What each finished session gave, against its plan: one line per completed or stopped session, newest first unless you sort otherwise. Times are in the unit’s time zone (${unitTimeZone}).`}
        actions={
          <a href={doseRecordsCsvHref(filter)} download className={buttonClasses('secondary')}>
            <FileDownloadIcon />
            Download CSV
            <span className="sr-only"> of the dose records this filter matches</span>
          </a>
        }
      />
      <DoseRecordFilters filter={filter} filtered={filtered} fieldErrors={fieldErrors} onChange={update} />
      {list.isPending ? (
        <LoadingPanel label="Loading dose records…" />
      ) : list.isError && !list.data ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title={Object.keys(fieldErrors).length > 0 ? 'The server refused this filter' : 'The dose records could not be loaded'}
          actions={
            <Button variant="secondary" icon={<ReloadIcon />} busy={list.isFetching} onClick={() => void list.refetch()}>
              Try again
            </Button>
          }
        >
          <p>{Object.keys(fieldErrors).length > 0 ? 'Correct the filters marked above.' : describeError(list.error)}</p>
        </StatusPanel>
      ) : list.data.total === 0 ? (
        <StatusPanel icon={<RecordLedgerIcon className="size-6" />} title={filtered ? 'No record matches these filters' : 'No finished sessions yet'}>
          <p>{filtered ? 'Widen the dates or clear the filters.' : 'A record appears here when a session is completed or stopped.'}</p>
        </StatusPanel>
      ) : (
        <>
          {list.isError && (
            <Alert tone="error" title="The list may be out of date" className="mb-4">
              {describeError(list.error)}
            </Alert>
          )}
          <DoseRecordsTable rows={list.data.records} total={list.data.total} filter={filter} protocolTitle={protocolTitle} onChange={update} busy={list.isPlaceholderData} />
        </>
      )}
    </>
  );
}
