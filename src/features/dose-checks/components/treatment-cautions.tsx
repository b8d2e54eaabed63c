import { ShieldEyeIcon } from '../../../components/ui/icons';

/**
 * The cautions every screen on the way to a PDT treatment carries, in our words; the protocol's
 * own list follows when it has loaded.
 */
export function TreatmentCautions({ protocolCautions }: { protocolCautions?: readonly string[] }) {
  return (
    <aside
      aria-labelledby="treatment-cautions-heading"
      className="rounded-2xl border border-paper-300 bg-paper-100 px-5 py-4 text-paper-900"
    >
      <h2 id="treatment-cautions-heading" className="flex items-center gap-2 font-semibold">
        <ShieldEyeIcon className="size-5 text-paper-700" />
        Before this dose goes any further
      </h2>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-sm leading-relaxed">
        <li>
          Confirm the patient’s identity and the eye to be treated against the order, at preparation
          and again at the bedside.
        </li>
        <li>
          Verteporfin makes the patient sensitive to light: skin and eyes are kept from sunlight and
          bright light for the period on the discharge sheet.
        </li>
        <li>
          If the infusion leaks into the tissue (extravasation): stop the infusion, apply a cool
          compress and keep the area out of light.
        </li>
        <li>Everyone in the treatment room wears eye protection rated for the laser.</li>
        <li>
          The protocol’s numbers must match your unit’s approved policy. Local policy, the product
          labelling and licensed practice prevail.
        </li>
      </ul>
      {protocolCautions && protocolCautions.length > 0 && (
        <details className="mt-3 text-sm">
          <summary className="cursor-pointer font-medium text-iris-800">
            The protocol version’s own cautions ({protocolCautions.length})
          </summary>
          <ul className="mt-2 list-disc space-y-1 pl-5 leading-relaxed">
            {protocolCautions.map((caution) => (
              <li key={caution}>{caution}</li>
            ))}
          </ul>
        </details>
      )}
    </aside>
  );
}
