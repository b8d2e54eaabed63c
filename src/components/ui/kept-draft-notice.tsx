import { useDraftsKeptInThisPage } from '../../lib/form-draft';

// Apart from the draft offer: the crash screens load with every page, and the offer's time
// formatting (luxon) would come with them.
/** For the crash screens: says, only when it is true, that what was typed waits after a reload. */
export function KeptDraftNotice() {
  const kept = useDraftsKeptInThisPage();
  if (!kept) return null;
  return (
    <p className="mt-2 font-medium">
      What you had typed and not saved was kept as a draft in this browser: reload, open the same
      form, and choose Restore.
    </p>
  );
}
