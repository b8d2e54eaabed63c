import { Button } from '../../../components/ui/button';
import { AlertIcon, StoredIcon, UnsentIcon } from '../../../components/ui/icons';
import { eventWords } from '../../../lib/session-event-words';
import type { SyncState } from '../api/event-sync';
import { capitalised, formatWardTime } from './clock-format';

/**
 * Whether every tap is stored. "Unsent: n" (word, number and icon) stays until the server has
 * each one; the taps already count on the clock meanwhile.
 */
export function SyncMarker({ unsent, sync, persistent }: { unsent: number; sync: SyncState; persistent: boolean }) {
  let detail: string | null = null;
  if (unsent > 0) {
    if (sync.offline) detail = 'no network; sent when it returns';
    else if (sync.refused) detail = 'held: the server refused one';
    else if (sync.sending) detail = 'sending…';
    else if (sync.retryAtMs !== null) detail = 'trying again shortly';
  }
  return (
    <div role="status" className="flex flex-col items-end text-right">
      {unsent > 0 ? (
        <p className="flex items-center gap-1.5 rounded-lg border-2 border-paper-900 bg-white px-2.5 py-1 font-semibold text-paper-950">
          <UnsentIcon className="size-5" />
          Unsent: {unsent}
        </p>
      ) : (
        <p className="flex items-center gap-1.5 px-2.5 py-1 font-medium text-paper-700">
          <StoredIcon className="size-5" />
          All taps stored
        </p>
      )}
      {detail && <p className="text-sm text-paper-700">{detail}</p>}
      {!persistent && <p className="text-sm font-medium text-alarm-700">This browser cannot keep unsent taps over a reload.</p>}
    </div>
  );
}

/** For someone watching: how fresh the stored taps on screen are (the clock itself runs on between fetches). */
export function WatchedAsOf({ updatedAtMs }: { updatedAtMs: number }) {
  return (
    <p className="flex items-center gap-1.5 px-2.5 py-1 font-medium text-paper-700">
      <StoredIcon className="size-5" />
      Stored taps as of {formatWardTime(updatedAtMs)}
    </p>
  );
}

/** A tap the server refused: it waits, with the server's reason, until it is sent again or discarded. */
export function RefusedTap({ sync, onSendAgain, onDiscard }: { sync: SyncState; onSendAgain: () => void; onDiscard: () => void }) {
  const refused = sync.refused;
  if (!refused) return null;
  const at = Date.parse(refused.event.clientTime);
  return (
    <div role="alert" className="flex flex-wrap items-center gap-3 rounded-xl border-2 border-alarm-700 bg-alarm-50 px-4 py-3">
      <AlertIcon className="size-6 text-alarm-700" />
      <div className="min-w-0 flex-1 text-paper-950">
        <p className="font-semibold">
          {capitalised(eventWords[refused.event.type])} tapped at {formatWardTime(at)} was not stored
        </p>
        <p className="text-sm">
          {refused.message}
          {refused.fields.length > 0 && ` (${refused.fields.map((field) => field.message).join('; ')})`}
        </p>
        <p className="text-sm">Later taps wait behind it, in order.</p>
      </div>
      <Button variant="secondary" size="sm" onClick={onSendAgain}>
        Send again
      </Button>
      <Button variant="danger" size="sm" onClick={onDiscard}>
        Discard this tap
      </Button>
    </div>
  );
}
