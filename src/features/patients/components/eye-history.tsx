import { Link } from 'react-router-dom';
import { formatUnitDateTime } from '../../../lib/unit-times';
import type { Eye } from '../../../../shared/schemas/patients';
import { paths } from '../../../config/paths';
import type { Treatment } from '../api/patient-response-schemas';
import { OrderStatusLabel } from '../../../components/ui/order-status-label';
import { isTreatment } from '../../../../shared/orders/lifecycle';

const kindWords = { pdt: 'Photodynamic therapy', cxl: 'Corneal cross-linking' } as const;

function daysText(treatment: Treatment): string {
  if (treatment.daysSincePreviousSameKind === null) {
    return isTreatment(treatment.status)
      ? 'First of its kind on this eye'
      : 'Not counted (not a treatment)';
  }
  const days = treatment.daysSincePreviousSameKind;
  return `${days} ${days === 1 ? 'day' : 'days'}`;
}

/** One eye's orders, newest first, with the gap since the previous treatment of the same kind. */
export function EyeHistory({ eye, treatments }: { eye: Eye; treatments: Treatment[] }) {
  const headingId = `eye-${eye}-heading`;
  const title = eye === 'right' ? 'Right eye' : 'Left eye';
  return (
    <section aria-labelledby={headingId} className="rounded-2xl border border-paper-200 bg-white">
      <h2
        id={headingId}
        className="border-b border-paper-200 px-5 py-3 text-xl font-semibold text-paper-950"
      >
        {title}
        <span className="ml-2 text-base font-normal text-paper-600">
          {treatments.length} {treatments.length === 1 ? 'order' : 'orders'}
        </span>
      </h2>
      {treatments.length === 0 ? (
        <p className="px-5 py-4 text-paper-700">No orders for the {eye} eye yet.</p>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-left">
            <caption className="sr-only">Orders for the {eye} eye, newest first</caption>
            <thead className="bg-paper-100 text-sm text-paper-700">
              <tr>
                <th scope="col" className="px-3 py-2 pl-5 font-semibold">
                  Date
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Treatment
                </th>
                <th scope="col" className="px-3 py-2 font-semibold">
                  Status
                </th>
                <th scope="col" className="px-3 py-2 pr-5 font-semibold">
                  Since the previous of the same kind
                </th>
              </tr>
            </thead>
            <tbody>
              {treatments.map((t) => (
                <tr key={t.orderId} className="border-t border-paper-200 align-top">
                  <td className="px-3 py-3 pl-5 whitespace-nowrap">
                    <Link
                      to={paths.order.getHref(t.orderId)}
                      className="font-medium text-iris-700 underline underline-offset-4 hover:text-iris-900"
                    >
                      {formatUnitDateTime(t.date)}
                    </Link>
                    <span className="block text-sm text-paper-600">
                      Order {t.orderId}
                      {t.revision > 1 ? `, revision ${t.revision}` : ''}
                    </span>
                  </td>
                  <td className="px-3 py-3">
                    <span className="block font-medium text-paper-950">{t.protocol.title}</span>
                    <span className="text-sm text-paper-600">
                      {kindWords[t.kind]} · version {t.protocol.version}
                    </span>
                  </td>
                  <td className="px-3 py-3">
                    <OrderStatusLabel status={t.status} wording="short" />
                  </td>
                  <td className="px-3 py-3 pr-5">{daysText(t)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
