import { CheckCircleIcon, PauseCircleIcon } from '../../../components/ui/icons';

/** Status as word + icon + outline style, so it reads the same without colour (and in print). */
export function PersonStatus({ active }: { active: boolean }) {
  if (active) {
    return (
      <span className="inline-flex items-center gap-1.5 rounded-full border border-iris-200 bg-iris-50 px-2.5 py-0.5 text-sm font-medium text-iris-800">
        <CheckCircleIcon className="size-4" />
        Active
      </span>
    );
  }
  return (
    <span className="inline-flex items-center gap-1.5 rounded-full border border-dashed border-paper-500 bg-paper-100 px-2.5 py-0.5 text-sm font-medium text-paper-700">
      <PauseCircleIcon className="size-4" />
      Deactivated
    </span>
  );
}
