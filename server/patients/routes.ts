import { z } from 'zod';
import { createPatientSchema, possibleDuplicatesQuerySchema } from '../../shared/schemas/patients';
import { signedInUser } from '../auth/sign-in-session';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import type { PatientService } from './service';

const searchQuery = z.object({
  q: z.string().max(80, 'q must be at most 80 characters').optional(),
});

export function patientRoutes(patients: PatientService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/patients',
      access: 'patients.read',
      handler: async (req, res) => {
        const { q } = parseInput(searchQuery, req.query);
        res.json({ patients: await patients.search(q) });
      },
    },
    {
      method: 'post',
      path: '/patients',
      access: 'patients.manage',
      handler: async (req, res) => {
        const input = parseInput(createPatientSchema, req.body);
        res.status(201).json({
          patient: await patients.create({ id: signedInUser(res).id, ipAddress: req.ip }, input),
        });
      },
    },
    {
      // Before /patients/:id, which would take "possible-duplicates" for an id.
      method: 'get',
      path: '/patients/possible-duplicates',
      access: 'patients.manage',
      handler: async (req, res) => {
        const query = parseInput(possibleDuplicatesQuerySchema, req.query);
        res.json({ patients: await patients.possibleDuplicates(query) });
      },
    },
    {
      method: 'get',
      path: '/patients/:id',
      access: 'patients.read',
      handler: async (req, res) => {
        res.json(
          await patients.history(parseInput(idParam, req.params.id, 'id'), {
            id: signedInUser(res).id,
            ipAddress: req.ip,
          }),
        );
      },
    },
    {
      method: 'get',
      path: '/patients/:id/measurements',
      access: 'patients.read',
      handler: async (req, res) => {
        res.json(await patients.measurements(parseInput(idParam, req.params.id, 'id')));
      },
    },
  ];
}
