import { useQuery } from '@tanstack/react-query';
import { FilteredListStates, filterProblems } from '../../../components/ui/filtered-list-states';
import { TrailLogIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { auditTrailQueries } from '../api/audit-trail-queries';
import { useAuditTrailParams } from '../hooks/use-audit-trail-params';
import { AuditChainCheck } from './audit-chain-check';
import { AuditTrailFilters } from './audit-trail-filters';
import { AuditTrailTable } from './audit-trail-table';

export function AuditTrailScreen({ mayVerify = false }: { mayVerify?: boolean }) {
  const { query, update, filtered } = useAuditTrailParams();
  const list = useQuery(auditTrailQueries.list(query));
  const fieldErrors = filterProblems(list.error);

  return (
    <>
      <PageHeader
        title="Audit trail"
        lead={`Who did what, and when: sign-ins, orders, checks, sessions and reviews, as the server wrote them. Nothing here can be changed. Times are in the unit’s time zone (${unitTimeZone}).`}
      />
      <AuditTrailFilters
        query={query}
        filtered={filtered}
        fieldErrors={fieldErrors}
        onChange={update}
      />
      <FilteredListStates
        list={list}
        refused={Object.keys(fieldErrors).length > 0}
        words={{
          loading: 'Loading the audit trail…',
          failed: 'The audit trail could not be loaded',
          stale: 'The list may be out of date',
        }}
        empty={{
          icon: <TrailLogIcon className="size-6" />,
          title: filtered ? 'No event matches these filters' : 'No events yet',
          body: filtered
            ? 'Widen the dates or clear the filters.'
            : 'Events appear as people use Luxtempo.',
        }}
      >
        {(data) => (
          <AuditTrailTable
            events={data.events}
            total={data.total}
            query={query}
            onChange={update}
            busy={list.isPlaceholderData}
          />
        )}
      </FilteredListStates>
      {mayVerify && <AuditChainCheck />}
    </>
  );
}
