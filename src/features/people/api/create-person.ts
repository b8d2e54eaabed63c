import { z } from 'zod';
import { personSchema, type CreatePerson, type Person } from '../../../../shared/schemas/people';
import { api } from '../../../lib/api-client';

const personResponseSchema = z.object({ person: personSchema });

export async function createPerson(input: CreatePerson): Promise<Person> {
  const { person } = await api.post('/people', input, { schema: personResponseSchema });
  return person;
}
