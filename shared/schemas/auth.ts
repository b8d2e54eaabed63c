import { z } from 'zod';
import { capabilities, roles } from '../roles';
import { newPasswordSchema } from './people';

export const loginRequestSchema = z.object({
  email: z
    .string({ error: 'email is required' })
    .trim()
    .min(1, 'email is required')
    .max(254, 'email must be at most 254 characters')
    .email('email must be an e-mail address'),
  password: z
    .string({ error: 'password is required' })
    .min(1, 'password is required')
    .max(200, 'password must be at most 200 characters'),
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

export const changePasswordSchema = z.object({
  currentPassword: z
    .string({ error: 'currentPassword is required' })
    .min(1, 'currentPassword is required')
    .max(200, 'currentPassword must be at most 200 characters'),
  newPassword: newPasswordSchema('newPassword'),
});
export type ChangePassword = z.infer<typeof changePasswordSchema>;

/** The token from an e-mailed link: 43 characters of base64url. */
const linkToken = z
  .string({ error: 'token is required' })
  .regex(/^[A-Za-z0-9_-]{43}$/, 'token must be the code from the e-mailed link');

export const passwordLinkCheckSchema = z.object({ token: linkToken });

export const setPasswordSchema = z.object({
  token: linkToken,
  password: newPasswordSchema('password'),
});
export type SetPassword = z.infer<typeof setPasswordSchema>;

export const passwordLinkInfoSchema = z.object({
  email: z.string(),
  displayName: z.string(),
  purpose: z.enum(['new-account', 'reset']),
});
export type PasswordLinkInfo = z.infer<typeof passwordLinkInfoSchema>;
