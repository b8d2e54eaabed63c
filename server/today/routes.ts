import type { RouteSpec } from '../http/route-table';
import { actorOf } from '../orders/routes';
import type { TodayService } from './service';

export function todayRoutes(today: TodayService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/today',
      access: 'today.view',
      handler: async (req, res) => {
        res.json(await today.forPerson(actorOf(req, res)));
      },
    },
  ];
}
