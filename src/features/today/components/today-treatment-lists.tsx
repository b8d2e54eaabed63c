import { useState } from 'react';
import { formatDuration, formatUnitTime } from '../../../../shared/format/figures';
import type { ListBooking, TreatmentList } from '../../../../shared/schemas/lists';
import type { OrderStatus } from '../../../../shared/schemas/orders';
import { LinkButton } from '../../../components/ui/button';
import { ClockIcon, HourglassIcon } from '../../../components/ui/icons-first';
import { OrderStatusLabel } from '../../../components/ui/order-status-label';
import { SelectField } from '../../../components/ui/select-field';
import { paths } from '../../../config/paths';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { useServerNowMs } from '../../../lib/server-now';
import { BeyondUseChip } from './beyond-use-chip';

const roomKey = 'luxtempo-today-room';
const at = (iso: string) => formatUnitTime(iso, unitTimeZone, 'short');
const eyeWords = { right: 'right eye', left: 'left eye' } as const;

/**
 * Today's treatment lists. The nurse picks her room (kept on this device) and sees its slots in
 * time order with each order's readiness; the pharmacist sees when each dose must be ready and
 * the time left to the latest safe reconstitution.
 */
export function TodayTreatmentLists({
  lists,
  clockOffsetMs,
  pharmacist,
  nurse,
}: {
  lists: TreatmentList[];
  clockOffsetMs: number;
  pharmacist: boolean;
  nurse: boolean;
}) {
  const rooms = [...new Set(lists.map((l) => l.room))];
  const [room, setRoom] = useState(() => {
    const kept = typeof localStorage === 'undefined' ? null : localStorage.getItem(roomKey);
    return kept && rooms.includes(kept) ? kept : 'all';
  });
  const shown = nurse && room !== 'all' ? lists.filter((l) => l.room === room) : lists;
  return (
    <section aria-labelledby="today-lists-heading" className="space-y-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h2 id="today-lists-heading" className="text-xl font-semibold text-paper-900">
          Today’s treatment lists
        </h2>
        {nurse && rooms.length > 1 && (
          <SelectField
            label="Your room"
            value={room}
            onChange={(e) => {
              setRoom(e.target.value);
              localStorage.setItem(roomKey, e.target.value);
            }}
            className="w-64"
          >
            <option value="all">Every room</option>
            {rooms.map((r) => (
              <option key={r} value={r}>
                {r}
              </option>
            ))}
          </SelectField>
        )}
      </div>
      {lists.length === 0 ? (
        <p className="rounded-xl border border-dashed border-paper-400 bg-paper-100 px-5 py-3 text-paper-800">
          No treatment lists today.
        </p>
      ) : (
        shown.map((list) => (
          <div key={list.id} className="space-y-2">
            <h3 className="text-lg font-semibold text-paper-900">
              {list.room}
              {list.deviceLabel && (
                <span className="font-normal text-paper-700"> · {list.deviceLabel}</span>
              )}
              <span className="font-normal text-paper-700"> · from {list.startTime}</span>
            </h3>
            {list.bookings.length === 0 ? (
              <p className="text-paper-700">Nothing booked on this list.</p>
            ) : (
              <ul className="divide-y divide-paper-200 overflow-hidden rounded-xl border border-paper-200 bg-white">
                {list.bookings.map((b) => (
                  <BookingRow
                    key={b.id}
                    booking={b}
                    clockOffsetMs={clockOffsetMs}
                    pharmacist={pharmacist}
                    nurse={nurse}
                  />
                ))}
              </ul>
            )}
          </div>
        ))
      )}
    </section>
  );
}

function BookingRow({
  booking: b,
  clockOffsetMs,
  pharmacist,
  nurse,
}: {
  booking: ListBooking;
  clockOffsetMs: number;
  pharmacist: boolean;
  nurse: boolean;
}) {
  const name = `${b.patient.familyName}, ${b.patient.givenName}`;
  const status = b.order.status as OrderStatus;
  const waitingForDrug = ['signed', 'checked'].includes(status);
  return (
    <li className="flex flex-wrap items-center gap-x-6 gap-y-2 px-5 py-3">
      <span className="numerals-steady w-28 text-lg font-semibold text-paper-950">
        {at(b.startsAt)}
        <span className="block text-xs font-normal text-paper-700">light starts</span>
      </span>
      <span className="min-w-52 flex-1">
        <span className="block font-semibold text-paper-950">{name}</span>
        <span className="text-sm text-paper-700">
          {eyeWords[b.order.eye]} · {b.order.protocolTitle} · order {b.order.id}
        </span>
      </span>
      <span className="flex flex-wrap items-center gap-2">
        <OrderStatusLabel status={status} wording="short" />
        {status === 'prepared' && b.order.beyondUseAt && (
          <BeyondUseChip
            beyondUseAt={b.order.beyondUseAt}
            clockOffsetMs={clockOffsetMs}
            subject={`Order ${b.order.id}, ${name}`}
          />
        )}
      </span>
      {pharmacist && b.readyBy && waitingForDrug && (
        <ReadyBy
          readyBy={b.readyBy}
          earliest={b.earliestReconstitutionAt}
          clockOffsetMs={clockOffsetMs}
        />
      )}
      {pharmacist && waitingForDrug && (
        <LinkButton size="sm" variant="secondary" to={paths.doseCheck.getHref(b.order.id)}>
          Check and prepare<span className="sr-only"> for {name}</span>
        </LinkButton>
      )}
      {nurse && ['prepared', 'ready', 'in-session'].includes(status) && (
        <LinkButton
          size="sm"
          to={paths.stepClock.getHref(b.order.id)}
          icon={<ClockIcon className="size-4" />}
        >
          Open step clock<span className="sr-only"> for {name}</span>
        </LinkButton>
      )}
    </li>
  );
}

/** When the dose must be ready, and the time left to the latest safe reconstitution time. */
function ReadyBy({
  readyBy,
  earliest,
  clockOffsetMs,
}: {
  readyBy: string;
  earliest: string | null;
  clockOffsetMs: number;
}) {
  const nowMs = useServerNowMs(clockOffsetMs);
  const leftMs = Date.parse(readyBy) - nowMs;
  const tooEarly = earliest !== null && nowMs < Date.parse(earliest);
  return (
    <span className="text-sm text-paper-900">
      <span className="font-semibold">Ready by {at(readyBy)}</span>
      <span className="numerals-steady ml-2 inline-flex items-center gap-1">
        <HourglassIcon className="size-4" />
        {leftMs > 0
          ? `${formatDuration(leftMs / 1000, 'hours-clock', { rounding: 'down' })} to the latest reconstitution`
          : 'late: the infusion should have started'}
      </span>
      {earliest && (
        <span className="block text-paper-700">
          {tooEarly ? 'Not before ' : 'Reconstitute from '}
          {at(earliest)} (beyond-use time)
        </span>
      )}
    </span>
  );
}
