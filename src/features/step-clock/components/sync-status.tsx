import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import { Button } from '../../../components/ui/button';
import { CrossCircleIcon, PlugOffIcon, StoredIcon, UnsentIcon } from '../../../components/ui/icons';
import type { SyncState } from '../api/event-sync';
import type { KeptTap } from '../api/tap-store';
import { formatWardTime } from './clock-format';
import { tapWords } from './recent-taps';

/**
 * Whether every tap is stored, in words, numbers and icons: "Unsent: n" stays until the server
 * has each one (they count on the clock meanwhile); "Refused: n" until the nurse has dealt with
 * each refused tap (they do not count). "All taps stored" only when neither is left ("All your
 * taps stored" while another person's taps are held on this tablet).
 */
export function SyncMarker({
  unsent,
  refused,
  held,
  sync,
  persistent,
  listId,
  listOpen,
  onToggleList,
}: {
  unsent: number;
  refused: number;
  held: { forOthers: number; unowned: number };
  sync: SyncState;
  persistent: boolean;
  listId: string;
  listOpen: boolean;
  onToggleList: () => void;
}) {
  let detail: string | null = null;
  if (unsent > 0) {
    if (sync.offline) detail = 'no network; sent when it returns';
    else if (sync.sending) detail = 'sending…';
    else if (sync.retryAtMs !== null) detail = 'trying again shortly';
  } else if (sync.offline) detail = 'no network; new taps are kept on this tablet';
  return (
    <div className="flex flex-col items-end gap-1 text-right">
      <div role="status" className="flex flex-col items-end">
        <div className="flex flex-wrap justify-end gap-2">
          {unsent > 0 && (
            <p className="flex items-center gap-1.5 rounded-lg border-2 border-paper-900 bg-white px-2.5 py-1 font-semibold text-paper-950">
              <UnsentIcon className="size-5" />
              Unsent: {unsent}
            </p>
          )}
          {refused > 0 && (
            <p className="flex items-center gap-1.5 rounded-lg border-2 border-alarm-700 bg-alarm-50 px-2.5 py-1 font-semibold text-alarm-800">
              <CrossCircleIcon className="size-5" />
              Refused: {refused}
            </p>
          )}
          {unsent === 0 && refused === 0 && (
            <p className="flex items-center gap-1.5 px-2.5 py-1 font-medium text-paper-700">
              <StoredIcon className="size-5" />
              {held.forOthers + held.unowned > 0 ? 'All your taps stored' : 'All taps stored'}
            </p>
          )}
        </div>
        {detail && (
          <p className="flex items-center gap-1 text-sm text-paper-700">
            {sync.offline && <PlugOffIcon className="size-4" />}
            {detail}
          </p>
        )}
        {held.forOthers > 0 && (
          <p className="text-sm font-medium text-paper-900">
            {held.forOthers === 1
              ? '1 tap by another person waits for them to sign in'
              : `${held.forOthers} taps by another person wait for them to sign in`}
            ; not counted here.
          </p>
        )}
        {held.unowned > 0 && (
          <p className="text-sm font-medium text-paper-900">
            {held.unowned === 1 ? '1 tap' : `${held.unowned} taps`} from before taps named their
            person: held, never sent, not counted here.
          </p>
        )}
        {!persistent && (
          <p className="text-sm font-medium text-alarm-700">
            This browser cannot keep unsent taps over a reload.
          </p>
        )}
      </div>
      {unsent + refused > 0 && (
        <Button
          variant="quiet"
          size="sm"
          aria-expanded={listOpen}
          aria-controls={listId}
          onClick={onToggleList}
        >
          {listOpen ? 'Hide the list' : 'List unsent and refused taps'}
        </Button>
      )}
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

const tappedAt = (tap: KeptTap) => formatWardTime(Date.parse(tap.event.clientTime));

/** Every tap this tablet still holds for the server, oldest first: what it is, when it was tapped, and why it waits. */
export function UnsentTaps({
  id,
  unsent,
  refused,
  protocol,
  sync,
}: {
  id: string;
  unsent: readonly KeptTap[];
  refused: readonly KeptTap[];
  protocol: ProtocolVersion;
  sync: SyncState;
}) {
  return (
    <section
      id={id}
      aria-label="Unsent and refused taps"
      className="rounded-xl border-2 border-paper-900 bg-white px-4 py-3"
    >
      <h2 className="font-semibold text-paper-950">Taps on this tablet not stored by the server</h2>
      {unsent.length === 0 && refused.length === 0 ? (
        <p className="text-sm text-paper-700">None: every tap is stored.</p>
      ) : (
        <ul className="mt-1.5 flex flex-col gap-1">
          {unsent.map((tap) => (
            <li key={tap.key} className="flex items-center gap-2 text-paper-950">
              <UnsentIcon className="size-5 shrink-0" />
              <span>
                <strong className="font-semibold">Unsent:</strong> {tapWords(tap.event, protocol)}{' '}
                at {tappedAt(tap)} —{' '}
                {sync.offline ? 'waiting for the network' : 'waiting to be sent'}
              </span>
            </li>
          ))}
          {refused.map((tap) => (
            <li key={tap.key} className="flex items-center gap-2 text-alarm-800">
              <CrossCircleIcon className="size-5 shrink-0" />
              <span>
                <strong className="font-semibold">Refused, not stored:</strong>{' '}
                {tapWords(tap.event, protocol)} at {tappedAt(tap)} (reason below)
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

/**
 * Taps the server refused: never shown as stored and not counted on the clock. Each stays on the
 * tablet, with the server's reason, until the nurse sends it again or discards it.
 */
export function RefusedTaps({
  refused,
  protocol,
  onSendAgain,
  onDiscard,
}: {
  refused: readonly KeptTap[];
  protocol: ProtocolVersion;
  onSendAgain: (key: string) => void;
  onDiscard: (key: string) => void;
}) {
  if (refused.length === 0) return null;
  return (
    <section
      role="alert"
      aria-label="Refused taps"
      className="flex flex-col gap-2 rounded-xl border-2 border-alarm-700 bg-alarm-50 px-4 py-3"
    >
      <p className="flex items-center gap-2 font-semibold text-paper-950">
        <CrossCircleIcon className="size-6 shrink-0 text-alarm-700" />
        {refused.length === 1
          ? 'The server refused 1 tap: it is not stored and does not count on the clock.'
          : `The server refused ${refused.length} taps: they are not stored and do not count on the clock.`}
      </p>
      <ul className="flex flex-col gap-2">
        {refused.map((tap) => {
          const words = `${tapWords(tap.event, protocol)} at ${tappedAt(tap)}`;
          return (
            <li
              key={tap.key}
              className="flex flex-wrap items-center gap-x-3 gap-y-1.5 border-t border-alarm-200 pt-2 first:border-t-0 first:pt-0"
            >
              <div className="min-w-0 flex-1 text-paper-950">
                <p className="font-semibold">Refused: {words}</p>
                <p className="text-sm">
                  Server’s reason: {tap.refusal?.message ?? 'none given'}
                  {tap.refusal &&
                    tap.refusal.fields.length > 0 &&
                    ` (${tap.refusal.fields.map((field) => field.message).join('; ')})`}
                </p>
              </div>
              <Button
                variant="secondary"
                size="sm"
                aria-label={`Send again: ${words.toLowerCase()}`}
                onClick={() => onSendAgain(tap.key)}
              >
                Send again
              </Button>
              <Button
                variant="danger"
                size="sm"
                aria-label={`Discard this tap: ${words.toLowerCase()}`}
                onClick={() => onDiscard(tap.key)}
              >
                Discard this tap
              </Button>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
