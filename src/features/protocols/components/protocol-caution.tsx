import { ShieldEyeIcon } from '../../../components/ui/icons';

/** The standing caution on every protocol page. */
export function ProtocolCaution({ className = '' }: { className?: string }) {
  return (
    <aside
      aria-label="Caution"
      className={`flex gap-3 rounded-lg border border-paper-300 bg-paper-100 px-4 py-3 text-paper-900 ${className}`}
    >
      <ShieldEyeIcon className="mt-0.5 size-5 text-paper-700" />
      <p className="text-sm leading-relaxed">
        <strong className="font-semibold">Caution: </strong>
        every figure here must match your unit’s approved policy, the product labelling and the
        device in use. The shipped versions are demo values. Local policy and licensed clinical
        judgement prevail.
      </p>
    </aside>
  );
}
