import { DateTime } from 'luxon';
import { formatUnitTime, zoneAbbreviation } from '../../../../shared/format/figures';
import { zonePlainName } from '../../../../shared/format/precision';
import type { Discharge } from '../api/discharge-schemas';
import { CxlAftercare } from './cxl-aftercare';
import { LightPrecaution, PdtEyeAdvice } from './light-precaution';
import { AcceptedCautionsBanner } from '../../../components/ui/accepted-cautions-banner';
import { PrintFrame } from '../../../components/ui/print-frame';
import { birthDateText, dayText } from './sheet-times';
import { TreatmentGiven } from './treatment-given';

const eyeCaps = { right: 'RIGHT EYE', left: 'LEFT EYE' } as const;
const treatmentNames = {
  pdt: 'photodynamic therapy (PDT)',
  cxl: 'corneal cross-linking (CXL)',
} as const;

/** The sheet the patient takes home; on screen it looks like the page it prints as. */
export function DischargeSheet({ discharge }: { discharge: Discharge }) {
  const { unitName, unitTimeZone: zone, patient, order, protocol, record } = discharge;
  const fullName = `${patient.givenName} ${patient.familyName}`;
  const treatedOn = record.sessionStartedAt ? dayText(record.sessionStartedAt, zone) : null;
  const now = DateTime.now().setZone(zone);
  const printedAt = formatUnitTime(now.toISO(), zone, 'record');

  const runningHead = (
    <p className="flex flex-wrap justify-between gap-x-4 border-b border-paper-950 pb-1 text-[9pt]">
      <span>
        <span className="font-semibold">
          {patient.familyName}, {patient.givenName}
        </span>{' '}
        · record {patient.recordNumber} · born {birthDateText(patient.dateOfBirth)}
      </span>
      <span className="font-bold">{eyeCaps[order.eye]}</span>
      <span>
        {unitName} · discharge advice · order {order.id}
      </span>
    </p>
  );

  return (
    <article
      aria-labelledby="discharge-title"
      data-print-sheet
      className="rounded-2xl border border-paper-200 bg-white p-6 sm:p-8 print:rounded-none print:border-0 print:p-0 print:text-[10.5pt] print:leading-snug"
    >
      <PrintFrame runningHead={runningHead}>
        <div className="space-y-6 print:space-y-4">
          <div className="space-y-4 border-b-2 border-paper-300 pb-5 print:space-y-2 print:pb-3">
            <p className="text-sm font-semibold tracking-wide text-paper-700 uppercase">
              {unitName}
            </p>
            <h1
              id="discharge-title"
              tabIndex={-1}
              data-page-heading
              className="text-3xl font-semibold tracking-tight text-paper-950 print:text-[20pt]"
            >
              Going home after your {treatmentNames[protocol.kind]}
            </h1>
            <div
              className="flex flex-wrap items-end justify-between gap-4"
              aria-label="Patient and treated eye"
              role="group"
            >
              <dl className="grid grid-cols-[max-content_1fr] gap-x-5 gap-y-1">
                <dt className="text-paper-700">Name</dt>
                <dd className="font-semibold text-paper-950">{fullName}</dd>
                <dt className="text-paper-700">Date of birth</dt>
                <dd className="text-paper-950">{birthDateText(patient.dateOfBirth)}</dd>
                <dt className="text-paper-700">Record number</dt>
                <dd className="numerals-steady text-paper-950">{patient.recordNumber}</dd>
                {treatedOn && (
                  <>
                    <dt className="text-paper-700">Treated on</dt>
                    <dd className="text-paper-950">{treatedOn}</dd>
                  </>
                )}
              </dl>
              <div className="rounded-xl border-2 border-paper-950 px-4 py-2 text-right">
                <p className="text-sm text-paper-700">Treated eye</p>
                <p className="text-3xl font-bold tracking-tight text-paper-950">
                  {eyeCaps[order.eye]}
                </p>
              </div>
            </div>
          </div>

          {record.outcome === 'in-progress' && (
            <p
              role="status"
              className="rounded-lg border-2 border-paper-950 px-4 py-2 font-medium text-paper-950"
            >
              The session is still running: this sheet shows only what has been recorded so far.
              Print it again when the session has ended.
            </p>
          )}

          <AcceptedCautionsBanner cautions={discharge.answeredCautions} />

          {/* After PDT the precaution is what the patient must carry home, so it comes first. */}
          {protocol.kind === 'pdt' ? (
            <>
              <LightPrecaution discharge={discharge} />
              <TreatmentGiven discharge={discharge} />
              <PdtEyeAdvice />
            </>
          ) : (
            <>
              <TreatmentGiven discharge={discharge} />
              <CxlAftercare />
            </>
          )}

          <section
            aria-labelledby="contact-heading"
            className="space-y-2 rounded-xl border border-paper-300 px-5 py-4 break-inside-avoid"
          >
            <h2 id="contact-heading" className="text-lg font-semibold text-paper-950">
              Questions or worries
            </h2>
            <p className="text-paper-900">
              Call {unitName}. In an emergency outside our opening hours, go to your nearest
              emergency department and take this sheet with you.
            </p>
            <dl className="grid gap-x-6 gap-y-3 pt-1 sm:grid-cols-2 print:grid-cols-2">
              <div>
                <dt className="text-sm text-paper-700">Unit telephone</dt>
                <dd className="mt-1 text-lg font-semibold text-paper-950">{discharge.unitPhone}</dd>
              </div>
              <div>
                <dt className="text-sm text-paper-700">Your next appointment</dt>
                <dd className="mt-5 border-b border-paper-600">
                  <span className="sr-only">Left blank, to be written in by hand</span>
                </dd>
              </div>
            </dl>
          </section>

          <footer className="space-y-1 border-t border-paper-300 pt-3 text-sm text-paper-800">
            <p>
              This is the standard advice of {unitName}. Local policy, and what your own doctor or
              nurse tells you, may change it; if they differ, follow what they tell you.
            </p>
            <p className="numerals-steady">
              Order {order.id}
              {order.revision > 1 ? ` (revision ${order.revision})` : ''} · {protocol.title},
              version {protocol.version} · printed {printedAt}
            </p>
            <p>
              Every time on this sheet is {zonePlainName(zone)}, the clock at {unitName}; the short
              zone name beside each time (such as {zoneAbbreviation(now)}) tells winter time from
              summer time.
            </p>
          </footer>
        </div>
      </PrintFrame>
    </article>
  );
}
