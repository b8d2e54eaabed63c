import { useRef, useState } from 'react';
import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import { withdrawalsApplied, type SessionEventLike } from '../../../../shared/session/dose-record';
import { isWithdrawableType } from '../../../../shared/session/session-events';
import { Button } from '../../../components/ui/button';
import { TurnBackIcon } from '../../../components/ui/icons';
import { eventWords } from '../../../lib/session-event-words';
import type { Urgency } from '../hooks/use-announcer';
import type { EventBody } from '../hooks/use-session-events';
import { capitalised, formatWardTime, stepNames } from './clock-format';
import { ReasonDialog } from './reason-dialog';

/** Enough to catch a slip just made without crowding the clock; older taps are for the auditor. */
const recentTapCount = 3;

export function tapWords(
  event: Pick<SessionEventLike, 'type'> & { stepId?: string | null },
  protocol: ProtocolVersion,
): string {
  const step = event.stepId ? protocol.steps.find((s) => s.id === event.stepId) : undefined;
  return `${capitalised(eventWords[event.type])}${step ? ` (${stepNames[step.kind]})` : ''}`;
}

/**
 * The last few taps of the running session, each of which can be withdrawn with a reason when it
 * was a mistake. A withdrawal is a tap of its own: the mistaken one stays in the record, marked.
 */
export function RecentTaps({
  orderId,
  protocol,
  events,
  headingId,
  onRecord,
  announce,
}: {
  orderId: number;
  protocol: ProtocolVersion;
  events: readonly SessionEventLike[];
  headingId: string;
  onRecord: (bodies: readonly EventBody[]) => void;
  announce: (text: string, urgency?: Urgency) => void;
}) {
  const [chosen, setChosen] = useState<SessionEventLike | null>(null);
  const headingRef = useRef<HTMLHeadingElement>(null);
  const { kept, withdrawn } = withdrawalsApplied(events);
  const recent = kept
    .filter((event) => isWithdrawableType(event.type))
    .sort((a, b) => Date.parse(b.clientTime) - Date.parse(a.clientTime))
    .slice(0, recentTapCount);

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-2">
      <h2 id={headingId} ref={headingRef} tabIndex={-1} className="font-semibold text-paper-950">
        Recent taps
      </h2>
      {recent.length === 0 ? (
        <p className="text-sm text-paper-700">No taps to correct yet.</p>
      ) : (
        <ul className="flex flex-col gap-1.5">
          {recent.map((event) => {
            const words = tapWords(event, protocol);
            const time = formatWardTime(Date.parse(event.clientTime));
            return (
              <li
                key={event.idempotencyKey}
                className="flex items-center gap-2 text-sm text-paper-950"
              >
                <span className="numerals-steady text-paper-700">{time}</span>
                <span className="min-w-0 flex-1">{words}</span>
                <Button
                  variant="secondary"
                  className="min-h-tap px-3 py-1.5 text-sm"
                  onClick={() => setChosen(event)}
                >
                  {/* One flex item, so the button's gap does not split the visible word from its ellipsis. */}
                  <span>
                    Withdraw
                    <span className="sr-only">
                      {' '}
                      {words.toLowerCase()} at {time}
                    </span>
                    …
                  </span>
                </Button>
              </li>
            );
          })}
        </ul>
      )}
      {withdrawn.length > 0 && (
        <ul className="flex flex-col gap-1 text-sm text-paper-800" aria-label="Withdrawn taps">
          {withdrawn.map((tap) => (
            <li key={tap.idempotencyKey}>
              <span className="font-semibold">Withdrawn:</span>{' '}
              <s>
                {tapWords(tap, protocol)} at {formatWardTime(Date.parse(tap.at))}
              </s>{' '}
              — “{tap.reason}”
            </li>
          ))}
        </ul>
      )}

      <ReasonDialog
        open={chosen !== null}
        onDismiss={() => setChosen(null)}
        title="Withdraw a tap"
        description={
          chosen && (
            <p>
              {tapWords(chosen, protocol)} at {formatWardTime(Date.parse(chosen.clientTime))} will
              no longer count in the times, drops or deviations. It stays in the record marked
              withdrawn, with your reason, for the auditor. If something did happen at another
              moment, tap it again when it does.
            </p>
          )
        }
        fieldLabel="Why was this tap a mistake?"
        confirmLabel="Withdraw tap"
        confirmIcon={<TurnBackIcon />}
        draftKey={`withdraw.${orderId}`}
        onConfirm={(reason) => {
          if (!chosen) return;
          const words = tapWords(chosen, protocol);
          setChosen(null);
          onRecord([{ type: 'tap-withdrawn', withdrawnKey: chosen.idempotencyKey, reason }]);
          announce(`${words} withdrawn.`);
          // The button that opened the dialog is gone with the tap; keep the focus in this list.
          requestAnimationFrame(() => headingRef.current?.focus());
        }}
      />
    </section>
  );
}
