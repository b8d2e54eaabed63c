import { z } from 'zod';
import { roles } from '../roles';

const roleList = z
  .array(z.enum(roles, { error: `roles must each be one of ${roles.join(', ')}` }))
  .min(1, 'roles must hold at least one role')
  .max(roles.length, `roles can hold at most ${roles.length} entries`)
  .refine((list) => new Set(list).size === list.length, 'roles must not repeat');

const displayName = z.string().trim().min(2, 'displayName must be 2 to 120 characters').max(120, 'displayName must be 2 to 120 characters');

/** A first password: long enough to resist guessing, short enough for bcrypt (72 bytes). */
export const passwordSchema = z
  .string({ error: 'password is required' })
  .min(12, 'password must be 12 to 72 characters')
  .max(72, 'password must be 12 to 72 characters');

export const createPersonSchema = z.object({
  email: z.string({ error: 'email is required' }).trim().toLowerCase().max(254, 'email must be at most 254 characters').email('email must be an e-mail address'),
  displayName,
  roles: roleList,
  password: passwordSchema,
});
export type CreatePerson = z.infer<typeof createPersonSchema>;

export const updatePersonSchema = z
  .object({
    displayName: displayName.optional(),
    roles: roleList.optional(),
    active: z.boolean({ error: 'active must be true or false' }).optional(),
  })
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'give at least one of displayName, roles, active');
export type UpdatePerson = z.infer<typeof updatePersonSchema>;

export const personSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  displayName: z.string(),
  roles: z.array(z.enum(roles)),
  active: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Person = z.infer<typeof personSchema>;

/** Every error body from the API has this shape. */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
  }),
});
export type ApiError = z.infer<typeof apiErrorSchema>;
