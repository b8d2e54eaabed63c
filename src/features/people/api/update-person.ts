import { z } from 'zod';
import { personSchema, type Person, type UpdatePerson } from '../../../../shared/schemas/people';
import { api } from '../../../lib/api-client';

const personResponseSchema = z.object({ person: personSchema });

export async function updatePerson({
  id,
  changes,
}: {
  id: number;
  changes: UpdatePerson;
}): Promise<Person> {
  const { person } = await api.patch(`/people/${encodeURIComponent(String(id))}`, changes, {
    schema: personResponseSchema,
  });
  return person;
}
