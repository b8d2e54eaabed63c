import type { FormDraftControl } from '../../lib/form-draft';
import { formatUnitDateTime } from '../../lib/unit-times';
import { Button } from './button';
import { InfoIcon } from './icons';

/** Offers back what a form held when this tab last left it unsaved (a crash, a reload). */
export function KeptDraftOffer<T>({ draft, what }: { draft: FormDraftControl<T>; what: string }) {
  if (!draft.offered) return null;
  return (
    <div role="status" className="flex flex-wrap items-center gap-3 rounded-lg border-2 border-iris-700 bg-iris-50 px-4 py-3">
      <InfoIcon className="size-5 text-iris-900" />
      <p className="min-w-0 flex-1 text-paper-950">
        <span className="font-semibold">Unsaved {what} from {formatUnitDateTime(draft.offered.savedAt)}</span> was kept in this browser when the
        page closed. Bring it back, or start afresh.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button type="button" onClick={draft.restore}>
          Bring it back
        </Button>
        <Button type="button" variant="secondary" onClick={draft.discard}>
          Discard it
        </Button>
      </div>
    </div>
  );
}
