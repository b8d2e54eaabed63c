import { z } from 'zod';
import { roles } from '../roles';

const roleList = z
  .array(z.enum(roles, { error: `roles must each be one of ${roles.join(', ')}` }))
  .min(1, 'roles must hold at least one role')
  .max(roles.length, `roles can hold at most ${roles.length} entries`)
  .refine((list) => new Set(list).size === list.length, 'roles must not repeat');

const displayName = z
  .string()
  .trim()
  .min(2, 'displayName must be 2 to 120 characters')
  .max(120, 'displayName must be 2 to 120 characters');

/**
 * A password a person sets: at least 12 characters (the server also refuses common ones). Any
 * length up to 200 counts in full: the server hashes the whole of it before bcrypt.
 */
export const newPasswordSchema = (field: string) =>
  z
    .string({ error: `${field} is required` })
    .refine((v) => [...v].length >= 12, `${field} must be at least 12 characters`)
    .refine((v) => [...v].length <= 200, `${field} must be at most 200 characters`);

/** The clinical roles: giving one needs a second administrator's approval. */
export const clinicalRoles = [
  'clinician',
  'pharmacist',
] as const satisfies readonly (typeof roles)[number][];

/** A new person gets no password from the admin: they are e-mailed a one-time link to set their own. */
export const createPersonSchema = z.object({
  email: z
    .string({ error: 'email is required' })
    .trim()
    .toLowerCase()
    .max(254, 'email must be at most 254 characters')
    .email('email must be an e-mail address'),
  displayName,
  roles: roleList,
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
  /** False until the person has set their own sign-in secret through their e-mailed link. */
  accountReady: z.boolean(),
  /** Roles waiting for a second administrator's approval, if any. */
  pendingRoleRequest: z
    .object({ id: z.number().int(), roles: z.array(z.enum(roles)), requestedBy: z.number().int() })
    .nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Person = z.infer<typeof personSchema>;

export const roleRequestSchema = z.object({
  id: z.number().int(),
  userId: z.number().int(),
  personName: z.string(),
  currentRoles: z.array(z.enum(roles)),
  roles: z.array(z.enum(roles)),
  requestedBy: z.number().int(),
  requestedByName: z.string(),
  requestedAt: z.string(),
});
export type RoleRequestView = z.infer<typeof roleRequestSchema>;

/** Every error body from the API has this shape. */
export const apiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
  }),
});
export type ApiError = z.infer<typeof apiErrorSchema>;
