import { z } from 'zod';
import {
  deviceChangeSchema,
  deviceInputSchema,
  lensInputSchema,
  outputCheckInputSchema,
} from '../../shared/schemas/devices';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import { actorOf } from '../orders/routes';
import type { DeviceService } from './service';

const lensQuery = z.object({
  retired: z.enum(['true', 'false'], { error: 'retired must be true or false' }).optional(),
});

export function deviceRoutes(devices: DeviceService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/devices',
      access: 'devices.read',
      handler: async (_req, res) => {
        res.json({ devices: await devices.list() });
      },
    },
    {
      method: 'post',
      path: '/devices',
      access: 'devices.manage',
      handler: async (req, res) => {
        const input = parseInput(deviceInputSchema, req.body);
        res.status(201).json({ device: await devices.create(actorOf(req, res), input) });
      },
    },
    {
      method: 'get',
      path: '/devices/:id',
      access: 'devices.read',
      handler: async (req, res) => {
        res.json(await devices.detail(parseInput(idParam, req.params.id, 'id')));
      },
    },
    {
      method: 'put',
      path: '/devices/:id',
      access: 'devices.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        const change = parseInput(deviceChangeSchema, req.body);
        res.json({ device: await devices.update(actorOf(req, res), id, change) });
      },
    },
    {
      method: 'post',
      path: '/devices/:id/output-checks',
      access: 'devices.check',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        const input = parseInput(outputCheckInputSchema, req.body);
        res.status(201).json(await devices.recordCheck(actorOf(req, res), id, input));
      },
    },
    {
      method: 'get',
      path: '/lenses',
      access: 'devices.read',
      handler: async (req, res) => {
        const { retired } = parseInput(lensQuery, req.query);
        res.json({ lenses: await devices.lenses(retired === 'true') });
      },
    },
    {
      method: 'post',
      path: '/lenses',
      access: 'devices.manage',
      handler: async (req, res) => {
        const input = parseInput(lensInputSchema, req.body);
        res.status(201).json({ lens: await devices.addLens(actorOf(req, res), input) });
      },
    },
    {
      method: 'post',
      path: '/lenses/:id/retirement',
      access: 'devices.manage',
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        res.json({ lens: await devices.retireLens(actorOf(req, res), id) });
      },
    },
  ];
}
