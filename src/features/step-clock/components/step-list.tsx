import type { ProtocolVersion } from '../../../../shared/protocol/protocol-schema';
import type { SessionClock } from '../../../../shared/session/session-clock';
import {
  CheckCircleIcon,
  ChevronRightIcon,
  DraftCircleIcon,
  MinusIcon,
  StatusInSessionIcon,
} from '../../../components/ui/icons';
import { formatElapsed } from './clock-format';
import type { SessionFacts } from './session-facts';

type StepState = 'done' | 'now' | 'next' | 'not-needed' | 'skipped' | 'later';

const looks: Record<StepState, { word: string; Icon: typeof CheckCircleIcon; text: string }> = {
  done: { word: 'Done', Icon: CheckCircleIcon, text: 'text-paper-700' },
  now: { word: 'Now', Icon: StatusInSessionIcon, text: 'text-paper-950 font-semibold' },
  next: { word: 'Next', Icon: ChevronRightIcon, text: 'text-paper-900' },
  'not-needed': { word: 'Not needed', Icon: MinusIcon, text: 'text-paper-600' },
  skipped: { word: 'Skipped', Icon: MinusIcon, text: 'text-paper-700' },
  later: { word: 'Later', Icon: DraftCircleIcon, text: 'text-paper-700' },
};

/** The protocol's steps in order, each with where the session stands, in a word and an icon. */
export function StepList({
  protocol,
  clock,
  facts,
  headingId,
}: {
  protocol: ProtocolVersion;
  clock: SessionClock;
  facts: SessionFacts;
  headingId: string;
}) {
  const currentIndex = clock.current?.index ?? clock.next?.index ?? protocol.steps.length;
  return (
    <section aria-labelledby={headingId}>
      <h2 id={headingId} className="font-semibold text-paper-950">
        Steps
      </h2>
      <ol className="mt-1 flex flex-col">
        {protocol.steps.map((step, index) => {
          let state: StepState = 'later';
          if (clock.current?.id === step.id) state = 'now';
          else if (clock.next?.id === step.id) state = 'next';
          else if (facts.doneStepIds.has(step.id)) state = 'done';
          else if (step.onlyIf && index < currentIndex) state = 'not-needed';
          else if (step.onlyIf && facts.lastThickness && clock.next && clock.next.index > index)
            state = 'not-needed';
          else if (index < currentIndex) state = 'skipped';
          const look = looks[state];
          return (
            <li
              key={step.id}
              aria-current={state === 'now' ? 'step' : undefined}
              className={`flex items-start gap-2 border-b border-paper-200 py-1.5 text-sm last:border-b-0 ${look.text}`}
            >
              <look.Icon className="mt-0.5 size-4" />
              <span className="w-20 shrink-0">{look.word}</span>
              <span className="min-w-0 flex-1">
                {step.title}
                {step.durationS !== null && (
                  <span className="numerals-steady text-paper-700">
                    {' '}
                    · {formatElapsed(step.durationS)}
                  </span>
                )}
              </span>
            </li>
          );
        })}
      </ol>
    </section>
  );
}
