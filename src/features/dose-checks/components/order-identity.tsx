import type { OrderDetail } from '../../../../shared/schemas/orders';
import { OrderStatusLabel } from '../../../components/ui/order-status-label';
import { eyeWords, patientName, unitDateTime } from './display-format';

/** Who and what the order is for: checked against the patient's wristband and the prescription. */
export function OrderIdentity({ order }: { order: OrderDetail }) {
  return (
    <section
      aria-label="Patient and order"
      className="rounded-2xl border border-paper-200 bg-white px-6 py-5"
    >
      <dl className="grid gap-x-8 gap-y-4 sm:grid-cols-2 lg:grid-cols-4">
        <div>
          <dt className="text-sm font-medium text-paper-600">Patient</dt>
          <dd className="mt-0.5 text-lg font-semibold text-paper-950">
            {patientName(order.patient)}
          </dd>
          <dd className="numerals-steady text-paper-800">Record {order.patient.recordNumber}</dd>
        </div>
        <div>
          <dt className="text-sm font-medium text-paper-600">Eye</dt>
          <dd className="mt-0.5 text-lg font-semibold uppercase tracking-wide text-paper-950">
            {eyeWords[order.eye]}
          </dd>
        </div>
        <div>
          <dt className="text-sm font-medium text-paper-600">Protocol</dt>
          <dd className="mt-0.5 font-medium text-paper-950">{order.protocol.title}</dd>
          <dd className="text-paper-800">
            {order.protocol.key}, version {order.protocol.version}
          </dd>
        </div>
        <div>
          <dt className="text-sm font-medium text-paper-600">Order</dt>
          <dd className="mt-0.5 numerals-steady text-paper-950">
            No. {order.id}, revision {order.revision}
          </dd>
          <dd className="text-paper-800">
            {order.signedAt
              ? `Signed ${unitDateTime(order.signedAt)}${order.signedBy ? ` by ${order.signedBy.displayName}` : ''}`
              : 'Not signed'}
          </dd>
          <dd className="mt-1.5">
            <OrderStatusLabel status={order.status} wording="long" />
          </dd>
        </div>
      </dl>
    </section>
  );
}
