import { doseGivenText } from '../../../lib/dose-given-words';
import type { Discharge } from '../api/discharge-schemas';
import { clockText, durationText, figureText, spanText } from './sheet-times';

type Row = { what: string; when: string; details: string };

const eyeName = { right: 'right eye', left: 'left eye' } as const;

function pdtRows({ record, order, unitTimeZone: zone }: Discharge): Row[] {
  const rows: Row[] = [];
  if (record.infusionStartAt) {
    // What was given, from the volume infused: never the ordered dose.
    const given = doseGivenText(record);
    const details = [
      given ? `verteporfin, ${given}` : 'verteporfin',
      record.infusionDurationS != null && record.infusionEndAt
        ? `over ${durationText(record.infusionDurationS)}`
        : 'still running when this sheet was made',
    ];
    rows.push({
      what: 'Medicine by drip into a vein',
      when: spanText(record.infusionStartAt, record.infusionEndAt, zone),
      details: details.join(', '),
    });
  }
  if (record.extravasationAt) {
    rows.push({
      what: 'Drip stopped: medicine leaked under the skin',
      when: clockText(record.extravasationAt, zone),
      details: 'keep that area covered and out of light until the time in the box below',
    });
  }
  if (record.lightStartAt) {
    const details = [
      // Laser times read in seconds, as the device shows them.
      record.deviceExposureS != null
        ? `light on for ${figureText(record.deviceExposureS, 's')} (the laser's display)`
        : record.lightOnS != null
          ? `light on for ${figureText(record.lightOnS, 's')}`
          : null,
      record.deliveredFluenceJPerCm2 != null
        ? `${figureText(record.deliveredFluenceJPerCm2, 'J/cm²')} delivered`
        : null,
    ].filter(Boolean);
    rows.push({
      what: `Laser light to the ${eyeName[order.eye]}`,
      when: spanText(record.lightStartAt, record.lightEndAt, zone),
      details: details.join(', ') || '—',
    });
  }
  return rows;
}

function cxlRows({ record, order, unitTimeZone: zone }: Discharge): Row[] {
  const rows: Row[] = [];
  if (record.soakStartAt) {
    rows.push({
      what: 'Riboflavin (vitamin B2) drops soaked into the cornea',
      when: spanText(record.soakStartAt, record.soakEndAt, zone),
      details:
        record.soakDurationS != null && record.soakEndAt
          ? `${durationText(record.soakDurationS)}`
          : 'still running when this sheet was made',
    });
  }
  if (record.thicknessBeforeUvUm != null) {
    rows.push({
      what: 'Corneal thickness measured before the light',
      when: '—',
      details: figureText(record.thicknessBeforeUvUm, 'µm'),
    });
  }
  if (record.uvStartAt) {
    const details = [
      record.uvOnS != null ? `light on for ${durationText(record.uvOnS)}` : null,
      record.deliveredFluenceJPerCm2 != null
        ? `${figureText(record.deliveredFluenceJPerCm2, 'J/cm²')} delivered`
        : null,
    ].filter(Boolean);
    rows.push({
      what: `Ultraviolet (UVA) light to the ${eyeName[order.eye]}`,
      when: spanText(record.uvStartAt, record.uvEndAt, zone),
      details: details.join(', ') || '—',
    });
  }
  return rows;
}

/** What was given and when, in the unit's local time, from the session's record. */
export function TreatmentGiven({ discharge }: { discharge: Discharge }) {
  const { record, protocol, unitTimeZone: zone } = discharge;
  const rows = protocol.kind === 'pdt' ? pdtRows(discharge) : cxlRows(discharge);
  return (
    <section aria-labelledby="treatment-given-heading" className="space-y-3 break-inside-avoid">
      <h2 id="treatment-given-heading" className="text-xl font-semibold text-paper-950">
        Your treatment
      </h2>
      <p className="text-paper-900">
        {protocol.title} (protocol version {protocol.version})
        {record.sessionStartedAt && (
          <>, {spanText(record.sessionStartedAt, record.endedAt, zone)}</>
        )}
        .
      </p>
      {rows.length === 0 ? (
        <p className="text-paper-800">No treatment step was recorded in this session.</p>
      ) : (
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">What was given and when, in the unit’s local time</caption>
          <thead>
            <tr className="border-b-2 border-paper-400 text-sm text-paper-700">
              <th scope="col" className="py-1.5 pr-4 font-medium">
                What
              </th>
              <th scope="col" className="py-1.5 pr-4 font-medium">
                When
              </th>
              <th scope="col" className="py-1.5 font-medium">
                Details
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.what} className="border-b border-paper-200 align-top">
                <th scope="row" className="py-2 pr-4 font-medium text-paper-950">
                  {row.what}
                </th>
                <td className="numerals-steady py-2 pr-4 whitespace-nowrap text-paper-950">
                  {row.when}
                </td>
                <td className="py-2 text-paper-900">{row.details}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {record.outcome === 'stopped' && (
        <p className="rounded-lg border-2 border-paper-900 px-4 py-2 text-paper-950">
          <span className="font-semibold">The treatment was stopped before the end</span>
          {record.endedAt && <> at {clockText(record.endedAt, zone)}</>}
          {record.stopReason && <>. Reason noted: {record.stopReason}</>}. Your nurse or doctor will
          explain what happens next.
        </p>
      )}
    </section>
  );
}
