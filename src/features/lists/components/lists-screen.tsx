import { useMutation, useQueries, useQuery, useQueryClient } from '@tanstack/react-query';
import { DateTime } from 'luxon';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { formatCalendarDate, formatUnitTime } from '../../../../shared/format/figures';
import { bookableStatuses } from '../../../../shared/lists/slots';
import type { TreatmentList } from '../../../../shared/schemas/lists';
import type { OrderSummary } from '../../../../shared/schemas/orders';
import { Alert } from '../../../components/ui/alert';
import { Button, LinkButton } from '../../../components/ui/button';
import { PageBackIcon, PageForwardIcon, PlusIcon } from '../../../components/ui/icons';
import { OrderStatusLabel } from '../../../components/ui/order-status-label';
import { PageHeader } from '../../../components/ui/page-header';
import { SelectField } from '../../../components/ui/select-field';
import { LoadingPanel } from '../../../components/ui/status-panel';
import { TextField } from '../../../components/ui/text-field';
import { paths } from '../../../config/paths';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError } from '../../../lib/api-client';
import {
  bookIntoList,
  cancelBooking,
  createList,
  listKeys,
  listsBetweenQuery,
} from '../../../lib/queries/lists';
import { devicesQuery } from '../../../lib/queries/devices';
import { getOrders, orderKeys } from '../../../lib/queries/orders';
import { todayKeys } from '../../../lib/queries/today';

const eyeWords = { right: 'Right eye', left: 'Left eye' } as const;
const slotTime = (iso: string) => formatUnitTime(iso, unitTimeZone, 'short');

function mondayOf(date: DateTime) {
  return date.startOf('week');
}

type Props = { canManage: boolean; canSeeVialPlan: boolean };

/** The week's treatment lists: make a list, book a signed order into a slot by picking it. */
export function ListsScreen({ canManage, canSeeVialPlan }: Props) {
  const [weekStart, setWeekStart] = useState(() =>
    mondayOf(DateTime.now().setZone(unitTimeZone)).toISODate()!,
  );
  const from = weekStart;
  const to = DateTime.fromISO(weekStart).plus({ days: 6 }).toISODate()!;
  const lists = useQuery(listsBetweenQuery(from, to));
  const bookable = useQueries({
    queries: bookableStatuses.map((status) => {
      const query = {
        status,
        sort: 'createdAt' as const,
        direction: 'asc' as const,
        page: 1,
        pageSize: 100,
      };
      return {
        queryKey: orderKeys.list(query),
        queryFn: ({ signal }: { signal: AbortSignal }) => getOrders(query, { signal }),
        enabled: canManage,
      };
    }),
  });
  const booked = new Set(
    (lists.data?.lists ?? []).flatMap((l) => l.bookings.map((b) => b.order.id)),
  );
  const candidates = bookable.flatMap((q) => q.data?.orders ?? []).filter((o) => !booked.has(o.id));
  const weekWords = `${formatCalendarDate(from)} – ${formatCalendarDate(to)}`;

  return (
    <div className="space-y-6">
      <PageHeader
        title="Treatment lists"
        lead="Each list is one room on one day, cut into slots; a signed order is booked into a slot. The slot's time is when the light starts."
      />
      <div className="flex flex-wrap items-center gap-3">
        <Button
          variant="secondary"
          icon={<PageBackIcon />}
          onClick={() => setWeekStart(DateTime.fromISO(weekStart).minus({ weeks: 1 }).toISODate()!)}
        >
          Previous week
        </Button>
        <p className="min-w-48 text-center font-semibold text-paper-900" aria-live="polite">
          Week of {weekWords}
        </p>
        <Button
          variant="secondary"
          icon={<PageForwardIcon />}
          onClick={() => setWeekStart(DateTime.fromISO(weekStart).plus({ weeks: 1 }).toISODate()!)}
        >
          Next week
        </Button>
      </div>
      {canManage && <NewListForm defaultDate={from} />}
      {lists.isPending ? (
        <LoadingPanel label="Loading the week's lists…" />
      ) : lists.isError ? (
        <Alert tone="error" title="The lists could not be loaded">
          {describeError(lists.error)}
        </Alert>
      ) : lists.data.lists.length === 0 ? (
        <p className="rounded-xl border border-dashed border-paper-400 bg-paper-100 px-5 py-3 text-paper-800">
          No lists this week.
        </p>
      ) : (
        lists.data.lists.map((list) => (
          <ListCard
            key={list.id}
            list={list}
            candidates={candidates}
            canManage={canManage}
            canSeeVialPlan={canSeeVialPlan}
          />
        ))
      )}
    </div>
  );
}

type NewListValues = {
  listDate: string;
  room: string;
  deviceLabel: string;
  startTime: string;
  sessionLengthMin: number;
  slotMin: number;
};

function NewListForm({ defaultDate }: { defaultDate: string }) {
  const queryClient = useQueryClient();
  const [open, setOpen] = useState(false);
  // The device register's in-service lasers and UV sources are offered; a plain room label still works.
  const devices = useQuery(devicesQuery());
  const registered = (devices.data ?? []).filter((d) => d.status === 'in-use');
  const form = useForm<NewListValues>({
    defaultValues: {
      listDate: defaultDate,
      room: '',
      deviceLabel: '',
      startTime: '09:00',
      sessionLengthMin: 180,
      slotMin: 30,
    },
  });
  const create = useMutation({
    mutationFn: (values: NewListValues) => createList(values),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: listKeys.all() });
      form.reset({ ...form.getValues(), room: '', deviceLabel: '' });
      setOpen(false);
    },
  });
  const fieldError = (name: keyof NewListValues) =>
    create.error && 'fields' in create.error
      ? (create.error as { fields: { path: string; message: string }[] }).fields.find(
          (f) => f.path === name,
        )?.message
      : undefined;
  if (!open)
    return (
      <Button icon={<PlusIcon />} onClick={() => setOpen(true)}>
        New list
      </Button>
    );
  return (
    <form
      aria-label="New treatment list"
      className="space-y-4 rounded-2xl border border-paper-200 bg-white p-5"
      onSubmit={form.handleSubmit((values) => create.mutate(values))}
    >
      <h2 className="text-lg font-semibold text-paper-950">New list</h2>
      <div className="grid gap-4 sm:grid-cols-3">
        <TextField
          label="Date"
          type="date"
          required
          error={fieldError('listDate')}
          {...form.register('listDate')}
        />
        <TextField label="Room" required error={fieldError('room')} {...form.register('room')} />
        <TextField
          label="Device (optional)"
          hint="Pick a device from the register, or type its label"
          list="list-registered-devices"
          error={fieldError('deviceLabel')}
          {...form.register('deviceLabel')}
        />
        <datalist id="list-registered-devices">
          {registered.map((d) => (
            <option key={d.id} value={d.name}>
              {d.location}
            </option>
          ))}
        </datalist>
        <TextField
          label="First slot at"
          type="time"
          required
          error={fieldError('startTime')}
          {...form.register('startTime')}
        />
        <TextField
          label="Session length (min)"
          type="number"
          inputMode="numeric"
          error={fieldError('sessionLengthMin')}
          {...form.register('sessionLengthMin', { valueAsNumber: true })}
        />
        <TextField
          label="Slot length (min)"
          type="number"
          inputMode="numeric"
          error={fieldError('slotMin')}
          {...form.register('slotMin', { valueAsNumber: true })}
        />
      </div>
      {create.isError && <Alert tone="error">{describeError(create.error)}</Alert>}
      <div className="flex gap-3">
        <Button type="submit" busy={create.isPending}>
          Save list
        </Button>
        <Button variant="secondary" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

function ListCard({
  list,
  candidates,
  canManage,
  canSeeVialPlan,
}: {
  list: TreatmentList;
  candidates: OrderSummary[];
  canManage: boolean;
  canSeeVialPlan: boolean;
}) {
  const queryClient = useQueryClient();
  const [problem, setProblem] = useState<string | null>(null);
  const refresh = () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: listKeys.all() }),
      queryClient.invalidateQueries({ queryKey: todayKeys.all() }),
    ]);
  const book = useMutation({
    mutationFn: (v: { orderId: number; slotIndex: number }) => bookIntoList(list.id, v),
    onSuccess: async () => {
      setProblem(null);
      await refresh();
    },
    onError: (error) => setProblem(describeError(error)),
  });
  const unbook = useMutation({
    mutationFn: (bookingId: number) => cancelBooking(bookingId),
    onSuccess: refresh,
    onError: (error) => setProblem(describeError(error)),
  });
  const headingId = `list-${list.id}`;
  const day = formatCalendarDate(list.listDate, 'day');
  return (
    <section
      aria-labelledby={headingId}
      className="space-y-3 rounded-2xl border border-paper-200 bg-white p-5"
    >
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h2 id={headingId} className="text-lg font-semibold text-paper-950">
          {day} · {list.room}
          {list.deviceLabel && (
            <span className="font-normal text-paper-700"> · {list.deviceLabel}</span>
          )}
        </h2>
        <p className="text-sm text-paper-700">
          {list.startTime}, {list.sessionLengthMin} min in {list.slotMin}-min slots ·{' '}
          {list.bookings.length} of {list.slots.length} booked
        </p>
        {canSeeVialPlan && (
          <LinkButton variant="secondary" size="sm" to={paths.vialPlan.getHref(list.id)}>
            Vial plan
            <span className="sr-only">
              {' '}
              for {list.room}, {day}
            </span>
          </LinkButton>
        )}
      </div>
      {problem && (
        <Alert tone="error" title="Not booked">
          {problem}
        </Alert>
      )}
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">
          Slots of {list.room} on {day}
        </caption>
        <thead>
          <tr className="border-b border-paper-300 text-sm text-paper-700">
            <th scope="col" className="py-2 pr-3 font-medium">
              Light at
            </th>
            <th scope="col" className="py-2 pr-3 font-medium">
              Patient and order
            </th>
            <th scope="col" className="py-2 pr-3 font-medium">
              Readiness
            </th>
            {canManage && (
              <th scope="col" className="py-2 font-medium">
                Booking
              </th>
            )}
          </tr>
        </thead>
        <tbody>
          {list.slots.map((slot) => {
            const booking = list.bookings.find((b) => b.slotIndex === slot.index);
            return (
              <tr key={slot.index} className="border-b border-paper-200 align-middle">
                <th
                  scope="row"
                  className="numerals-steady whitespace-nowrap py-2 pr-3 font-semibold text-paper-900"
                >
                  {slotTime(slot.startsAt)}
                </th>
                {booking ? (
                  <>
                    <td className="py-2 pr-3">
                      <span className="font-semibold text-paper-950">
                        {booking.patient.familyName}, {booking.patient.givenName}
                      </span>
                      <span className="block text-sm text-paper-700">
                        {eyeWords[booking.order.eye]} · {booking.order.protocolTitle} · order{' '}
                        {booking.order.id}
                      </span>
                    </td>
                    <td className="py-2 pr-3">
                      <OrderStatusLabel
                        status={booking.order.status as OrderSummary['status']}
                        wording="short"
                      />
                    </td>
                    {canManage && (
                      <td className="py-2">
                        <Button
                          variant="quiet"
                          size="sm"
                          busy={unbook.isPending && unbook.variables === booking.id}
                          onClick={() => unbook.mutate(booking.id)}
                        >
                          Take off the list
                          <span className="sr-only"> at {slotTime(slot.startsAt)}</span>
                        </Button>
                      </td>
                    )}
                  </>
                ) : (
                  <>
                    <td className="py-2 pr-3 text-paper-600">Free</td>
                    <td className="py-2 pr-3" />
                    {canManage && (
                      <td className="py-2">
                        <BookSlot
                          slotLabel={`${slotTime(slot.startsAt)}, ${list.room}`}
                          candidates={candidates}
                          busy={book.isPending && book.variables?.slotIndex === slot.index}
                          onBook={(orderId) => book.mutate({ orderId, slotIndex: slot.index })}
                        />
                      </td>
                    )}
                  </>
                )}
              </tr>
            );
          })}
        </tbody>
      </table>
    </section>
  );
}

function BookSlot({
  slotLabel,
  candidates,
  busy,
  onBook,
}: {
  slotLabel: string;
  candidates: OrderSummary[];
  busy: boolean;
  onBook: (orderId: number) => void;
}) {
  const [orderId, setOrderId] = useState('');
  return (
    <div className="flex flex-wrap items-end gap-2">
      <SelectField
        label={<span className="sr-only">Order to book at {slotLabel}</span>}
        value={orderId}
        onChange={(e) => setOrderId(e.target.value)}
        className="min-w-64 flex-1"
      >
        <option value="">Pick a signed order…</option>
        {candidates.map((o) => (
          <option key={o.id} value={o.id}>
            {o.patient.familyName}, {o.patient.givenName} · {o.eye} eye · {o.protocol.title} · order{' '}
            {o.id}
          </option>
        ))}
      </SelectField>
      <Button
        size="sm"
        disabled={orderId === ''}
        busy={busy}
        onClick={() => onBook(Number(orderId))}
        className="min-h-tap"
      >
        Book<span className="sr-only"> at {slotLabel}</span>
      </Button>
    </div>
  );
}
