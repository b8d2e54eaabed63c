import type { Ref } from 'react';
import type { OrderDetail } from '../../../../shared/schemas/orders';
import { VialCheckIcon } from '../../../components/ui/icons';
import { unitTimeZoneLabel } from '../../../config/unit-time-zone';
import { quantity, unitDateTime } from './display-format';
import { LiveBeyondUseCountdown } from './live-beyond-use-countdown';

type PreparationRecordProps = {
  order: OrderDetail;
  preparation: NonNullable<OrderDetail['preparation']>;
  headingRef?: Ref<HTMLHeadingElement>;
};

/** What was prepared, and — while the dose waits for the patient — how long it stays usable. */
export function PreparationRecord({ order, preparation, headingRef }: PreparationRecordProps) {
  const rows: [string, string][] = [
    ['Vial lot', preparation.vialLot],
    ['Vial expiry', preparation.vialExpiry],
    ['Reconstituted at', `${unitDateTime(preparation.reconstitutedAt)} (${unitTimeZoneLabel})`],
    ['Volume drawn', quantity(preparation.volumeDrawnMl, 'mL')],
    ['Beyond-use time', `${unitDateTime(preparation.beyondUseAt)} (${unitTimeZoneLabel})`],
    ['Prepared by', preparation.pharmacist?.displayName ?? '—'],
  ];
  return (
    <section
      aria-labelledby="preparation-record-heading"
      className="space-y-5 rounded-2xl border border-paper-200 bg-white p-6"
    >
      <h2
        ref={headingRef}
        tabIndex={-1}
        id="preparation-record-heading"
        className="flex items-center gap-2 text-xl font-semibold text-paper-950"
      >
        <VialCheckIcon className="size-6 text-iris-700" />
        Prepared
      </h2>
      {order.status === 'prepared' && (
        <LiveBeyondUseCountdown beyondUseAt={preparation.beyondUseAt} />
      )}
      <dl className="numerals-steady grid grid-cols-[auto_1fr] gap-x-6 gap-y-2">
        {rows.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-paper-700">{label}</dt>
            <dd className="text-paper-950">{value}</dd>
          </div>
        ))}
      </dl>
    </section>
  );
}
