import { ShieldEyeIcon } from '../../../components/ui/icons';

export function LightCaution() {
  return (
    <aside
      aria-label="Caution"
      className="flex gap-3 rounded-lg border border-paper-300 bg-paper-100 px-4 py-3 text-paper-900"
    >
      <ShieldEyeIcon className="mt-0.5 size-5 text-paper-700" />
      <p className="text-sm leading-relaxed">
        <strong className="font-semibold">Caution: </strong>
        this is arithmetic only. Before any treatment, the figures must match your unit’s approved
        protocol and the laser or UV device in use, as calibrated. Everyone in the room wears eye
        protection rated for the light.
      </p>
    </aside>
  );
}
