import { z } from 'zod';
import { personSchema, type Person } from '../../../../shared/schemas/people';
import { api } from '../../../lib/api-client';

const peopleResponseSchema = z.object({ people: z.array(personSchema) });

export async function getPeople({ signal }: { signal?: AbortSignal } = {}): Promise<Person[]> {
  const { people } = await api.get('/people', { schema: peopleResponseSchema, signal });
  return people;
}
