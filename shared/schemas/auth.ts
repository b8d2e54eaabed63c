import { z } from 'zod';
import { capabilities, roles } from '../roles';

export const loginRequestSchema = z.object({
  email: z.string({ error: 'email is required' }).trim().min(1, 'email is required').max(254, 'email must be at most 254 characters').email('email must be an e-mail address'),
  password: z.string({ error: 'password is required' }).min(1, 'password is required').max(200, 'password must be at most 200 characters'),
});
export type LoginRequest = z.infer<typeof loginRequestSchema>;

export const sessionUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  displayName: z.string(),
  roles: z.array(z.enum(roles)),
  capabilities: z.array(z.enum(capabilities)),
});
export type SessionUser = z.infer<typeof sessionUserSchema>;
