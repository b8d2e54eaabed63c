import { formatUnitTime } from '../../../../shared/format/figures';
import { Link } from 'react-router-dom';
import type { OrderSummary } from '../../../../shared/schemas/orders';
import { LinkButton } from '../../../components/ui/button';
import { ChevronRightIcon, ClockIcon } from '../../../components/ui/icons-first';
import { OrderStatusLabel } from '../../../components/ui/order-status-label';
import { paths } from '../../../config/paths';
import { unitTimeZone } from '../../../config/unit-time-zone';
import type { Worklist } from '../api/get-today';
import { BeyondUseChip } from './beyond-use-chip';

const emptyWords: Record<string, string> = {
  'clinician-drafts': 'You have no draft orders.',
  'clinician-returned': 'No orders have been sent back to you.',
  'pharmacist-checks': 'No orders are waiting for a dose check.',
  'pharmacist-preparation': 'No checked orders are waiting for preparation.',
  'pharmacist-prepared': 'No prepared doses are waiting for treatment.',
  'nurse-ready': 'No orders are ready for treatment.',
};

/** The pharmacist's lists open the dose-check screen, where checking and preparing happen; the rest open the order. */
const doseCheckLists = new Set([
  'pharmacist-checks',
  'pharmacist-preparation',
  'pharmacist-prepared',
]);

/** The nurse's list of orders ready for treatment also leads straight to the bedside step clock. */
const stepClockLists = new Set(['nurse-ready']);

const eyeWords = { right: 'Right eye', left: 'Left eye' } as const;

function rowHref(listId: string, order: OrderSummary): string {
  return doseCheckLists.has(listId)
    ? paths.doseCheck.getHref(order.id)
    : paths.order.getHref(order.id);
}

function signedText(order: OrderSummary): string | null {
  const at = order.signedAt ?? null;
  if (!at) return `Started ${formatUnitTime(order.createdAt, unitTimeZone, 'record')}`;
  return `Signed ${formatUnitTime(at, unitTimeZone, 'record')}${order.signedBy ? ` by ${order.signedBy.displayName}` : ''}`;
}

export function WorklistSection({
  list,
  clockOffsetMs,
}: {
  list: Worklist;
  clockOffsetMs: number;
}) {
  const headingId = `worklist-${list.id}`;
  return (
    <section aria-labelledby={headingId} className="space-y-2.5">
      <h3 id={headingId} className="flex items-baseline gap-3 text-lg font-semibold text-paper-900">
        {list.title}
        <span className="numerals-steady rounded-full bg-paper-200 px-2.5 py-0.5 text-base font-medium text-paper-800">
          {list.orders.length}
          <span className="sr-only">{list.orders.length === 1 ? ' order' : ' orders'}</span>
        </span>
      </h3>
      {list.orders.length === 0 ? (
        <p className="rounded-xl border border-dashed border-paper-400 bg-paper-100 px-5 py-3 text-paper-800">
          {emptyWords[list.id] ?? 'Nothing here right now.'}
        </p>
      ) : (
        <ul className="divide-y divide-paper-200 overflow-hidden rounded-xl border border-paper-200 bg-white">
          {list.orders.map((order) => {
            const name = `${order.patient.familyName}, ${order.patient.givenName}`;
            return (
              <li
                key={order.id}
                className="relative flex flex-wrap items-center gap-x-6 gap-y-2 px-5 py-3.5 hover:bg-paper-100"
              >
                <span className="min-w-52 flex-1">
                  {/* The name is the link; its ::after covers the row, so the whole row is one large target. */}
                  <Link
                    to={rowHref(list.id, order)}
                    className="block font-semibold text-iris-800 underline-offset-4 after:absolute after:inset-0 hover:underline"
                  >
                    {name}
                  </Link>
                  <span className="numerals-steady block text-sm text-paper-700">
                    Record {order.patient.recordNumber} · order {order.id}
                  </span>
                </span>
                <span className="w-24 font-medium text-paper-900">{eyeWords[order.eye]}</span>
                <span className="min-w-48 flex-1 text-paper-800">
                  {order.protocol.title}{' '}
                  <span className="text-paper-700">v{order.protocol.version}</span>
                  <span className="block text-sm text-paper-700">{signedText(order)}</span>
                </span>
                <span className="flex flex-wrap items-center gap-2">
                  <OrderStatusLabel status={order.status} wording="short" />
                  {order.status === 'prepared' && order.kind === 'pdt' && order.beyondUseAt && (
                    <BeyondUseChip
                      beyondUseAt={order.beyondUseAt}
                      clockOffsetMs={clockOffsetMs}
                      subject={`Order ${order.id}, ${name}`}
                    />
                  )}
                </span>
                {stepClockLists.has(list.id) && (
                  // Above the row-wide link, so it takes its own presses.
                  <LinkButton
                    variant="primary"
                    size="sm"
                    to={paths.stepClock.getHref(order.id)}
                    icon={<ClockIcon className="size-4" />}
                    className="relative z-10 ml-auto"
                  >
                    Open step clock
                    <span className="sr-only">
                      {' '}
                      for {name}, order {order.id}
                    </span>
                  </LinkButton>
                )}
                <ChevronRightIcon className="size-5 text-paper-600" />
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
