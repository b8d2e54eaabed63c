import { stepClockStatuses } from '../../shared/orders/lifecycle';
import type { OrderSummary } from '../../shared/schemas/orders';
import type { Clock } from '../clock';
import type { ListService } from '../lists/service';
import type { OrderRepository } from '../orders/repository';
import { toOrderSummary, type Actor } from '../orders/service';

/** Today reads orders by status through the orders' repository: one query, not a copy of it. */
type TodayRepository = Pick<OrderRepository, 'listByStatus'>;

export interface TodayList {
  id: string;
  title: string;
  orders: OrderSummary[];
}

/** Each role's worklist, built for the roles the person holds. */
async function todayLists(orders: TodayRepository, actor: Actor): Promise<TodayList[]> {
  const lists: TodayList[] = [];
  const summaries = (rows: Awaited<ReturnType<TodayRepository['listByStatus']>>) =>
    rows.map(toOrderSummary);
  if (actor.roles.includes('clinician')) {
    lists.push({
      id: 'clinician-drafts',
      title: 'Your draft orders',
      orders: summaries(await orders.listByStatus(['draft'], { createdById: actor.id })),
    });
    lists.push({
      id: 'clinician-returned',
      title: 'Orders sent back after the dose check',
      orders: summaries(await orders.listByStatus(['returned'], { signedById: actor.id })),
    });
  }
  if (actor.roles.includes('pharmacist')) {
    const waiting = (await orders.listByStatus(['signed'])).filter(
      (o) => o.signedById !== actor.id,
    );
    lists.push({
      id: 'pharmacist-checks',
      title: 'Waiting for a dose check',
      orders: summaries(waiting),
    });
    lists.push({
      id: 'pharmacist-preparation',
      title: 'Checked, waiting for preparation',
      orders: summaries(await orders.listByStatus(['checked'])),
    });
    lists.push({
      id: 'pharmacist-prepared',
      title: 'Prepared, with beyond-use time',
      orders: summaries(await orders.listByStatus(['prepared'])),
    });
  }
  if (actor.roles.includes('nurse')) {
    // A running session stays on the list, so a nurse coming back to the tablet finds it.
    lists.push({
      id: 'nurse-ready',
      title: 'Ready for treatment or running',
      orders: summaries(await orders.listByStatus(stepClockStatuses)),
    });
  }
  return lists;
}

export function createTodayService(deps: {
  orders: TodayRepository;
  clock: Clock;
  lists: Pick<ListService, 'today'>;
}) {
  return {
    /**
     * The person's worklists and today's treatment lists (the nurse's room in slot order, the
     * pharmacist's ready-by times), with the server's time so the client can measure its offset.
     */
    async forPerson(actor: Actor) {
      return {
        lists: await todayLists(deps.orders, actor),
        treatmentLists: await deps.lists.today(),
        serverTime: deps.clock.now().toISOString(),
      };
    },
  };
}

export type TodayService = ReturnType<typeof createTodayService>;
