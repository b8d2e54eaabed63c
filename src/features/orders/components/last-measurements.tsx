import { formatMeasureWithConversion } from '../../../../shared/engine/units';
import { formatUnitDateTime } from '../../../lib/unit-times';
import type { RecordedMeasurement } from '../../../../shared/schemas/patients';
import { describeError } from '../../../lib/api-client';
import type { useLastMeasurements } from '../hooks/use-last-measurements';

type LastMeasurementsProps = {
  last: ReturnType<typeof useLastMeasurements>;
};

const shown = 3;

function measureText(m: RecordedMeasurement): string {
  const parts = [
    m.height ? `height ${formatMeasureWithConversion(m.height)}` : null,
    m.weight ? `weight ${formatMeasureWithConversion(m.weight)}` : null,
  ];
  return parts.filter(Boolean).join(', ');
}

/** The heights and weights signed on this patient's earlier orders, beside the boxes for today's. */
export function LastMeasurements({ last }: LastMeasurementsProps) {
  const { query, measurements, rule } = last;
  return (
    <section
      aria-labelledby="last-measurements-heading"
      className="rounded-lg border border-paper-200 bg-paper-50 px-4 py-3"
    >
      <h3 id="last-measurements-heading" className="font-semibold text-paper-900">
        Last recorded for this patient
      </h3>
      {query.isPending ? (
        <p className="text-sm text-paper-700">Loading the patient’s recorded measurements…</p>
      ) : query.isError ? (
        <p className="text-sm text-alarm-700">
          The recorded measurements could not be loaded ({describeError(query.error)}). The server
          still compares the weight when the order is signed.
        </p>
      ) : measurements.length === 0 ? (
        <p className="text-sm text-paper-700">
          No height or weight has been recorded on a signed order for this patient yet.
        </p>
      ) : (
        <ul className="mt-1 space-y-0.5 text-sm text-paper-900">
          {measurements.slice(0, shown).map((m) => (
            <li key={m.orderId} className="numerals-steady">
              <span className="text-paper-700">{formatUnitDateTime(m.measuredAt)}:</span>{' '}
              {measureText(m)}
            </li>
          ))}
        </ul>
      )}
      {rule && (
        <p className="mt-1 text-sm text-paper-700">
          A weight more than {rule.maxPct} % from the last one recorded within {rule.withinDays}{' '}
          days needs a reason.
        </p>
      )}
    </section>
  );
}
