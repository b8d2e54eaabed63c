import { HiddenEyeIcon } from '../../../components/ui/icons';

/** Why the plan is not on screen yet: the check is worth something only if it is done blind. */
export function FiguresHiddenNote() {
  return (
    <aside
      aria-label="Why the plan is hidden"
      className="flex gap-3 rounded-lg border border-iris-200 bg-iris-50 px-4 py-3 text-iris-950"
    >
      <HiddenEyeIcon className="mt-0.5 size-5 text-iris-800" />
      <p className="text-sm leading-relaxed">
        <strong className="font-semibold">
          The plan’s figures stay hidden until yours agree.{' '}
        </strong>
        A second check only catches a slip when it is worked out independently: seeing the answer
        first draws your own sum towards it. Work out the BSA, the dose and the drug volume from the
        measurements and the protocol below. When they agree with the plan within the protocol’s
        tolerance, the plan and its working appear beside your figures; if they do not, you are told
        which figures differ, not by how much.
      </p>
    </aside>
  );
}
