import { useQuery } from '@tanstack/react-query';
import { useCallback } from 'react';
import { buttonClasses } from '../../../components/ui/button';
import { FilteredListStates, filterProblems } from '../../../components/ui/filtered-list-states';
import { FileDownloadIcon, RecordLedgerIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { doseRecordQueries } from '../api/dose-record-queries';
import { doseRecordsCsvHref } from '../api/get-dose-records';
import { useDoseRecordListParams } from '../hooks/use-dose-record-list-params';
import { DoseRecordFilters } from './dose-record-filters';
import { DoseRecordsTable } from './dose-records-table';

export function DoseRecordsScreen() {
  const { filter, update, filtered } = useDoseRecordListParams();
  const list = useQuery(doseRecordQueries.list(filter));
  const protocols = useQuery(doseRecordQueries.protocolChoices());
  const fieldErrors = filterProblems(list.error);
  const titles = protocols.data;
  const protocolTitle = useCallback(
    (key: string) => titles?.find((p) => p.key === key)?.title ?? key,
    [titles],
  );

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
      <DoseRecordFilters
        filter={filter}
        filtered={filtered}
        fieldErrors={fieldErrors}
        onChange={update}
      />
      <FilteredListStates
        list={list}
        refused={Object.keys(fieldErrors).length > 0}
        words={{
          loading: 'Loading dose records…',
          failed: 'The dose records could not be loaded',
          stale: 'The list may be out of date',
        }}
        empty={{
          icon: <RecordLedgerIcon className="size-6" />,
          title: filtered ? 'No record matches these filters' : 'No finished sessions yet',
          body: filtered
            ? 'Widen the dates or clear the filters.'
            : 'A record appears here when a session is completed or stopped.',
        }}
      >
        {(data) => (
          <DoseRecordsTable
            rows={data.records}
            total={data.total}
            filter={filter}
            protocolTitle={protocolTitle}
            onChange={update}
            busy={list.isPlaceholderData}
          />
        )}
      </FilteredListStates>
    </>
  );
}
