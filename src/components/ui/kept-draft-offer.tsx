import { formatUnitTime } from '../../../shared/format/figures';
import { unitTimeZone } from '../../config/unit-time-zone';
import type { FormDraftControl } from '../../lib/form-draft';
import { Button } from './button';
import { InfoIcon } from './icons';

/** "10:42 WET" for a draft kept today (the unit's day), "2 Dec 2026, 10:42 WET" for an older one. */
function keptAt(iso: string): string {
  const today = formatUnitTime(new Date().toISOString(), unitTimeZone, 'date');
  const sameDay = formatUnitTime(iso, unitTimeZone, 'date') === today;
  return formatUnitTime(iso, unitTimeZone, sameDay ? 'short' : 'record');
}

/** Offers back what a form held when it was last left unsaved (a crash, a reload, a closed tab). */
export function KeptDraftOffer<T>({ draft, what }: { draft: FormDraftControl<T>; what: string }) {
  if (!draft.offered) return null;
  return (
    <div
      role="status"
      aria-label="Kept draft"
      className="my-3 flex flex-wrap items-center gap-3 rounded-lg first:mt-0 border-2 border-iris-700 bg-iris-50 px-4 py-3"
    >
      <InfoIcon className="size-5 text-iris-900" />
      <p className="min-w-0 flex-1 text-paper-950">
        <span className="font-semibold">A draft from {keptAt(draft.offered.savedAt)} was kept</span>{' '}
        — the {what} you had typed and not saved. Restore it, or discard it and start afresh.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button type="button" onClick={draft.restore}>
          Restore
        </Button>
        <Button type="button" variant="secondary" onClick={draft.discard}>
          Discard
        </Button>
      </div>
    </div>
  );
}
