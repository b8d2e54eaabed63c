import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { roles } from '../../../shared/roles';
import {
  personSchema,
  roleRequestSchema,
  type Person,
  type RoleRequestView,
} from '../../../shared/schemas/people';
import { api } from '../api-client';
import type { Fetching } from './request';

/*
 * One cache for people: the admin's list and role requests, and the staff names the auditors'
 * filters offer. A change to a person invalidates all of it.
 */

const peopleResponseSchema = z.object({ people: z.array(personSchema) });
const staffSchema = z.object({
  staff: z.array(
    z.object({
      id: z.number(),
      displayName: z.string(),
      roles: z.array(z.enum(roles)),
      active: z.boolean(),
    }),
  ),
});
export type Staff = z.infer<typeof staffSchema>;

export const peopleKeys = {
  all: () => ['people'] as const,
  lists: () => [...peopleKeys.all(), 'list'] as const,
  roleRequests: () => [...peopleKeys.all(), 'role-requests'] as const,
  staff: () => [...peopleKeys.all(), 'staff'] as const,
};

export async function getPeople({ signal }: Fetching = {}): Promise<Person[]> {
  const { people } = await api.get('/people', { schema: peopleResponseSchema, signal });
  return people;
}

export async function getRoleRequests({ signal }: Fetching = {}): Promise<RoleRequestView[]> {
  const { requests } = await api.get('/role-requests', {
    schema: z.object({ requests: z.array(roleRequestSchema) }),
    signal,
  });
  return requests;
}

export const peopleListQuery = () =>
  queryOptions({ queryKey: peopleKeys.lists(), queryFn: ({ signal }) => getPeople({ signal }) });

export const roleRequestsQuery = () =>
  queryOptions({
    queryKey: peopleKeys.roleRequests(),
    queryFn: ({ signal }) => getRoleRequests({ signal }),
  });

/** Staff names for a filter (`GET /api/staff`, which auditors may read). */
export const staffQuery = () =>
  queryOptions({
    queryKey: peopleKeys.staff(),
    queryFn: ({ signal }) => api.get('/staff', { schema: staffSchema, signal }),
    staleTime: 5 * 60_000,
  });
