import { ShieldEyeIcon } from '../../../components/ui/icons';
import { withoutSourceMarks } from '../../../../shared/protocol/source-marks';
import type { Discharge } from '../api/discharge-schemas';

/** For the nurse on screen only: the protocol version's cautions and where the precaution period comes from. */
export function StaffNotes({ discharge }: { discharge: Discharge }) {
  const { cautions, precaution, protocol } = discharge;
  return (
    <aside
      aria-labelledby="staff-notes-heading"
      className="space-y-3 rounded-2xl border border-paper-300 bg-paper-100 px-5 py-4 text-paper-900 print:hidden"
    >
      <h2 id="staff-notes-heading" className="flex items-center gap-2 text-lg font-semibold">
        <ShieldEyeIcon className="size-5 text-paper-700" />
        For staff (not printed)
      </h2>
      <ul className="list-disc space-y-1 pl-5 text-sm leading-relaxed">
        <li>
          Check the name, date of birth and treated eye on the sheet with the patient before giving
          it.
        </li>
        <li>
          Go through the advice with the patient; the sheet supports that conversation, it does not
          replace it.
        </li>
        {protocol.kind === 'pdt' && precaution && (
          <li>
            The precaution period of {precaution.hours} h is set by the protocol version and counted
            from the start of the infusion; the protocol page names its source.
          </li>
        )}
      </ul>
      {cautions.length > 0 && (
        <>
          <h3 className="text-sm font-semibold">
            Cautions of {protocol.title}, version {protocol.version}
          </h3>
          <ul className="list-disc space-y-1 pl-5 text-sm leading-relaxed">
            {cautions.map((caution) => (
              <li key={caution}>{withoutSourceMarks(caution)}</li>
            ))}
          </ul>
        </>
      )}
    </aside>
  );
}
