import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { paths } from '../../../config/paths';
import { describeError } from '../../../lib/api-client';
import { followUpQueries } from '../api/follow-up-queries';

/** The clinician's overdue follow-up visits on Today: past their due date and not recorded. */
export function OverdueVisits() {
  const query = useQuery(followUpQueries.overdue());
  return (
    <section
      aria-labelledby="overdue-visits-heading"
      className="mt-8 rounded-2xl border border-paper-200 bg-white"
    >
      <h2
        id="overdue-visits-heading"
        className="border-b border-paper-200 px-5 py-3 text-xl font-semibold text-paper-950"
      >
        Overdue follow-up visits
        {query.data && (
          <span className="ml-2 text-base font-normal text-paper-600">
            {query.data.visits.length}
          </span>
        )}
      </h2>
      {query.isPending ? (
        <p className="px-5 py-4 text-paper-700">Loading…</p>
      ) : query.isError ? (
        <div className="px-5 py-4">
          <Alert tone="error">{describeError(query.error)}</Alert>
        </div>
      ) : query.data.visits.length === 0 ? (
        <p className="px-5 py-4 text-paper-700">No follow-up visit is overdue.</p>
      ) : (
        <ul className="divide-y divide-paper-200">
          {query.data.visits.map((v) => (
            <li key={v.id} className="flex flex-wrap items-baseline gap-x-4 px-5 py-3">
              <Link
                className="font-medium text-iris-800 underline"
                to={paths.patient.getHref(v.patientId)}
              >
                {v.familyName}, {v.givenName} ({v.recordNumber})
              </Link>
              <span>
                {v.eye} eye · {v.visitLabel} visit due {v.dueOn} ·{' '}
                <strong>
                  {v.daysOverdue} {v.daysOverdue === 1 ? 'day' : 'days'} overdue
                </strong>
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
