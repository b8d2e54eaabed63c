import type { Announcement } from '../hooks/use-announcer';

/**
 * The two live regions of the clock. They stay in the page from the start (a region added
 * together with its text is often not read) and receive only step changes and warnings.
 */
export function LiveRegions({
  polite,
  assertive,
}: {
  polite: Announcement | null;
  assertive: Announcement | null;
}) {
  return (
    <div className="sr-only">
      <div role="status" aria-live="polite" aria-atomic="true">
        {polite && <p key={polite.serial}>{polite.text}</p>}
      </div>
      <div role="alert" aria-live="assertive" aria-atomic="true">
        {assertive && <p key={assertive.serial}>{assertive.text}</p>}
      </div>
    </div>
  );
}
