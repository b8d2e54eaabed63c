import { useQuery } from '@tanstack/react-query';
import { formatUnitTime } from '../../../../shared/format/figures';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { fhirDeliveriesQuery, type FhirDelivery } from '../api/fhir-deliveries';

const statusWords: Record<FhirDelivery['status'], string> = {
  pending: 'Waiting to be sent',
  sent: 'Sent',
  failed: 'Refused by the FHIR server',
  superseded: 'Replaced by a newer version before it was sent',
};

const when = (iso: string | null) => formatUnitTime(iso, unitTimeZone, 'record');

/** Treatment records waiting for, or delivered to, the hospital's FHIR server. */
export function FhirDeliveries() {
  const query = useQuery({ ...fhirDeliveriesQuery(), refetchInterval: 30_000 });
  if (!query.data?.enabled) return null;
  const rows = query.data.deliveries;
  return (
    <section aria-labelledby="fhir-deliveries-heading" className="mt-10">
      <h2 id="fhir-deliveries-heading" className="mb-2 text-xl font-semibold text-paper-950">
        Treatment records to the hospital (FHIR)
      </h2>
      <p className="mb-4 text-paper-700">
        Each ended session is sent as a FHIR transaction; a later change to its record sends a new
        version. They wait here while the FHIR server is down.
      </p>
      {rows.length === 0 ? (
        <p className="text-paper-800">No treatment records yet.</p>
      ) : (
        <div className="overflow-x-auto rounded-2xl border border-paper-200 bg-white">
          <table className="w-full text-left">
            <thead className="bg-paper-50 text-sm text-paper-700">
              <tr>
                <th scope="col" className="px-4 py-2">
                  Order
                </th>
                <th scope="col" className="px-4 py-2">
                  Version
                </th>
                <th scope="col" className="px-4 py-2">
                  Status
                </th>
                <th scope="col" className="px-4 py-2">
                  Attempts
                </th>
                <th scope="col" className="px-4 py-2">
                  Stored / sent
                </th>
                <th scope="col" className="px-4 py-2">
                  Last problem
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-paper-200">
              {rows.map((d) => (
                <tr key={d.id}>
                  <td className="px-4 py-2">
                    <Link
                      to={paths.order.getHref(d.orderId)}
                      className="font-medium text-iris-700 underline underline-offset-4"
                    >
                      Order {d.orderId}
                    </Link>
                  </td>
                  <td className="px-4 py-2">
                    {d.version} ({d.reason === 'session-ended' ? 'session ended' : 'record changed'}
                    )
                  </td>
                  <td className="px-4 py-2 font-medium">{statusWords[d.status]}</td>
                  <td className="px-4 py-2">{d.attempts}</td>
                  <td className="px-4 py-2">
                    {when(d.createdAt)}
                    {d.sentAt
                      ? ` / ${when(d.sentAt)}`
                      : d.status === 'pending'
                        ? ` / next try ${when(d.nextAttemptAt)}`
                        : ''}
                  </td>
                  <td className="px-4 py-2 [overflow-wrap:anywhere]">{d.lastError ?? '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
