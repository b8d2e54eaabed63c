import { useId } from 'react';
import type { AftercareItem } from '../../../../shared/session/session-events';
import { Button, LinkButton } from '../../../components/ui/button';
import { CheckCircleIcon, DraftCircleIcon } from '../../../components/ui/icons';
import { paths } from '../../../config/paths';
import type { EventBody } from '../hooks/use-session-events';

/** One line of the list: done when any of its items is on record. */
const lines: { label: string; items: { item: AftercareItem; button: string }[] }[] = [
  {
    label: 'Light and after-care advice given',
    items: [{ item: 'advice', button: 'Advice given' }],
  },
  {
    label: 'Discharge sheet printed or e-mailed',
    items: [
      { item: 'sheet-printed', button: 'Sheet printed' },
      { item: 'sheet-emailed', button: 'Sheet e-mailed' },
    ],
  },
  {
    label: 'Unit’s contact number given',
    items: [{ item: 'contact-number', button: 'Contact number given' }],
  },
];

/**
 * The after-care step's short checklist. Each item is a tap stored as an event (who and when);
 * a mistaken one is withdrawn like any other tap, from the list of recent taps.
 */
export function AftercareChecklist({
  orderId,
  stepId,
  done,
  onRecord,
}: {
  orderId: number;
  stepId: string;
  done: ReadonlySet<AftercareItem>;
  onRecord: (bodies: readonly EventBody[]) => void;
}) {
  const headingId = useId();
  return (
    <section
      aria-labelledby={headingId}
      className="flex flex-col gap-1.5 rounded-xl border border-paper-300 bg-paper-100 px-4 py-2"
    >
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 id={headingId} className="text-lg font-semibold text-paper-950">
          After-care checklist
        </h3>
        <LinkButton to={paths.orderDischarge.getHref(orderId)}>Open the discharge sheet</LinkButton>
      </div>
      <ul className="flex flex-col gap-1">
        {lines.map((line) => {
          const isDone = line.items.some(({ item }) => done.has(item));
          return (
            <li key={line.label} className="flex flex-wrap items-center gap-2">
              <span
                className={`flex min-w-52 flex-1 items-center gap-2 text-base ${isDone ? 'font-semibold text-iris-800' : 'text-paper-950'}`}
              >
                {isDone ? (
                  <CheckCircleIcon className="size-6 shrink-0" />
                ) : (
                  <DraftCircleIcon className="size-6 shrink-0" />
                )}
                {line.label}
                <span className="sr-only">{isDone ? ': done' : ': not yet'}</span>
              </span>
              {line.items.map(({ item, button }) =>
                isDone ? null : (
                  <Button
                    key={item}
                    variant="secondary"
                    className="py-1"
                    onClick={() => onRecord([{ type: 'aftercare-checked', stepId, item }])}
                  >
                    {button}
                  </Button>
                ),
              )}
            </li>
          );
        })}
      </ul>
    </section>
  );
}
