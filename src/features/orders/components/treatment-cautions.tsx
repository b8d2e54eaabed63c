import type { ProtocolKind } from '../../../../shared/protocol/protocol-schema';
import { withoutSourceMarks } from '../../../../shared/protocol/source-marks';
import { ShieldEyeIcon } from '../../../components/ui/icons';

type TreatmentCautionsProps = {
  kind: ProtocolKind | null;
  /** The protocol version's own cautions, shown as written in the version. */
  protocolCautions?: readonly string[];
  className?: string;
};

/** The standing cautions on every screen that leads to treatment, then the protocol's own. */
export function TreatmentCautions({
  kind,
  protocolCautions = [],
  className = '',
}: TreatmentCautionsProps) {
  const protection =
    kind === 'cxl'
      ? 'Everyone in the room wears UV eye protection during the exposure.'
      : kind === 'pdt'
        ? 'Everyone in the room wears eye protection rated for the treatment laser’s wavelength.'
        : 'Everyone in the room wears eye protection rated for the laser or UV source in use.';
  return (
    <aside
      aria-labelledby="treatment-cautions-heading"
      className={`rounded-2xl border border-paper-300 bg-paper-100 px-5 py-4 text-paper-900 ${className}`}
    >
      <h2
        id="treatment-cautions-heading"
        className="mb-2 flex items-center gap-2 text-lg font-semibold"
      >
        <ShieldEyeIcon className="size-5 text-paper-700" />
        Cautions
      </h2>
      <ul className="list-disc space-y-1 pl-5 text-sm leading-relaxed">
        <li>{protection}</li>
        <li>
          Confirm the patient’s identity and the treatment eye with the patient and the notes before
          treatment starts.
        </li>
        {kind !== 'cxl' && (
          <li>
            After verteporfin the patient is photosensitive: skin and eyes are kept from direct
            sunlight and bright light until the precaution period ends.
          </li>
        )}
        <li>
          Every number here must match the unit’s approved policy and the product labelling; local
          policy and licensed clinical judgement prevail.
        </li>
      </ul>
      {protocolCautions.length > 0 && (
        <>
          <h3 className="mt-3 mb-1 text-sm font-semibold">From this protocol version</h3>
          <ul className="list-disc space-y-1 pl-5 text-sm leading-relaxed">
            {protocolCautions.map((caution) => (
              <li key={caution}>{withoutSourceMarks(caution)}</li>
            ))}
          </ul>
        </>
      )}
    </aside>
  );
}
