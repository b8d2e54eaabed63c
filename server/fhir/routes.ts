import { z } from 'zod';
import { signedInUser } from '../auth/sign-in-session';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import type { FhirService } from './service';

const patientSearchQuery = z
  .strictObject({
    recordNumber: z
      .string()
      .trim()
      .regex(/^[A-Za-z0-9-]{3,20}$/, 'recordNumber must be 3 to 20 letters, digits or hyphens')
      .optional(),
    name: z
      .string()
      .trim()
      .min(2, 'name must be 2 to 80 characters')
      .max(80, 'name must be 2 to 80 characters')
      .optional(),
  })
  .refine((q) => (q.recordNumber === undefined) !== (q.name === undefined), {
    message: 'give either recordNumber or name (one of them)',
    path: ['recordNumber'],
  });

export function fhirRoutes(fhir: FhirService): RouteSpec[] {
  return [
    {
      method: 'get',
      path: '/fhir/status',
      access: 'signed-in',
      handler: (_req, res) => {
        res.json(fhir.status());
      },
    },
    {
      method: 'get',
      path: '/fhir/patients',
      access: 'patients.manage',
      handler: async (req, res) => {
        res.json(await fhir.searchPatients(parseInput(patientSearchQuery, req.query)));
      },
    },
    {
      method: 'post',
      path: '/patients/:id/fhir-refresh',
      access: 'patients.manage',
      handler: async (req, res) => {
        res.json(
          await fhir.refreshPatient(
            { id: signedInUser(res).id, ipAddress: req.ip },
            parseInput(idParam, req.params.id, 'id'),
          ),
        );
      },
    },
    {
      method: 'get',
      path: '/orders/:id/fhir',
      access: 'orders.read',
      handler: async (req, res) => {
        const bundle = await fhir.currentBundle(parseInput(idParam, req.params.id, 'id'), {
          id: signedInUser(res).id,
          ipAddress: req.ip,
        });
        res.type('application/fhir+json').send(JSON.stringify(bundle));
      },
    },
    {
      method: 'get',
      path: '/outbox/fhir',
      access: 'outbox.read',
      handler: async (_req, res) => {
        res.json({ enabled: fhir.status().enabled, deliveries: await fhir.deliveries() });
      },
    },
  ];
}
