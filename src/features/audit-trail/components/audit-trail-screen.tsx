import { useQuery } from '@tanstack/react-query';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { AlertIcon, ReloadIcon, TrailLogIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { auditTrailQueries } from '../api/audit-trail-queries';
import { useAuditTrailParams } from '../hooks/use-audit-trail-params';
import { AuditTrailFilters } from './audit-trail-filters';
import { AuditTrailTable } from './audit-trail-table';

export function AuditTrailScreen() {
  const { query, update, filtered } = useAuditTrailParams();
  const list = useQuery(auditTrailQueries.list(query));
  const fieldErrors: Record<string, string> =
    isApiRequestError(list.error) && list.error.status === 400 ? Object.fromEntries(list.error.fields.map((f) => [f.path.split('.')[0] ?? f.path, f.message])) : {};

  return (
    <>
      <PageHeader
        title="Audit trail"
        lead={`Who did what, and when: sign-ins, orders, checks, sessions and reviews, as the server wrote them. Nothing here can be changed. Times are in the unit’s time zone (${unitTimeZone}).`}
      />
      <AuditTrailFilters query={query} filtered={filtered} fieldErrors={fieldErrors} onChange={update} />
      {list.isPending ? (
        <LoadingPanel label="Loading the audit trail…" />
      ) : list.isError && !list.data ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title={Object.keys(fieldErrors).length > 0 ? 'The server refused this filter' : 'The audit trail could not be loaded'}
          actions={
            <Button variant="secondary" icon={<ReloadIcon />} busy={list.isFetching} onClick={() => void list.refetch()}>
              Try again
            </Button>
          }
        >
          <p>{Object.keys(fieldErrors).length > 0 ? 'Correct the filters marked above.' : describeError(list.error)}</p>
        </StatusPanel>
      ) : list.data.total === 0 ? (
        <StatusPanel icon={<TrailLogIcon className="size-6" />} title={filtered ? 'No event matches these filters' : 'No events yet'}>
          <p>{filtered ? 'Widen the dates or clear the filters.' : 'Events appear as people use Luxtempo.'}</p>
        </StatusPanel>
      ) : (
        <>
          {list.isError && (
            <Alert tone="error" title="The list may be out of date" className="mb-4">
              {describeError(list.error)}
            </Alert>
          )}
          <AuditTrailTable events={list.data.events} total={list.data.total} query={query} onChange={update} busy={list.isPlaceholderData} />
        </>
      )}
    </>
  );
}
