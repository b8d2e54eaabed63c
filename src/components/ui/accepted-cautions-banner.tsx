import { useId } from 'react';
import { AlertIcon } from './icons';

export type AcceptedCaution = { id: string; question: string; reason: string };

/**
 * The standing banner for cautions the clinician answered yes to and gave a reason for: shown on
 * the signed order, the dose check and preparation, the step clock's pre-checks, the dose record
 * and the discharge sheet, so everyone who handles the treatment reads the same reason.
 */
export function AcceptedCautionsBanner({
  cautions,
  className = '',
}: {
  cautions: readonly AcceptedCaution[];
  className?: string;
}) {
  const headingId = useId();
  if (cautions.length === 0) return null;
  return (
    <section
      aria-labelledby={headingId}
      data-testid="accepted-cautions"
      className={`rounded-2xl border-2 border-alarm-700 bg-alarm-50 px-5 py-4 text-paper-950 print:border print:bg-white ${className}`}
    >
      <h2 id={headingId} className="flex items-center gap-2 font-semibold text-alarm-800">
        <AlertIcon className="size-5" />
        {cautions.length === 1
          ? 'A caution was accepted when this order was signed'
          : `${cautions.length} cautions were accepted when this order was signed`}
      </h2>
      <ul className="mt-2 space-y-2">
        {cautions.map((caution) => (
          <li key={caution.id}>
            <p className="font-medium">{caution.question} — yes</p>
            <p className="text-sm leading-relaxed">
              <span className="font-medium">Clinician’s reason: </span>
              {caution.reason}
            </p>
          </li>
        ))}
      </ul>
    </section>
  );
}
