import { z } from 'zod';
import { personSchema, type Person } from '../../../../shared/schemas/people';
import { api } from '../../../lib/api-client';

const id = (n: number) => encodeURIComponent(String(n));

/** Asks the server to e-mail the person a one-time link; the admin never sees the link. */
export async function sendPasswordLink(personId: number): Promise<void> {
  await api.post(
    `/people/${id(personId)}/password-link`,
    {},
    { schema: z.object({ passwordLink: z.literal('sent') }) },
  );
}

/** Signs the person out on every device, at once. */
export async function endSessions(personId: number): Promise<{ ended: number }> {
  return api.post(
    `/people/${id(personId)}/sessions/end`,
    {},
    { schema: z.object({ ended: z.number().int() }) },
  );
}

export { getRoleRequests } from '../../../lib/queries/people';

export async function decideRoleRequest({
  requestId,
  decision,
}: {
  requestId: number;
  decision: 'approval' | 'rejection';
}): Promise<Person> {
  const { person } = await api.post(
    `/role-requests/${id(requestId)}/${decision}`,
    {},
    { schema: z.object({ person: personSchema }) },
  );
  return person;
}
