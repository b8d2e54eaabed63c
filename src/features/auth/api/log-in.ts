import { z } from 'zod';
import type { LoginRequest, SessionUser } from '../../../../shared/schemas/auth';
import { sessionUserSchema } from '../../../../shared/schemas/auth';
import { api } from '../../../lib/api-client';

const loginResponseSchema = z.object({ user: sessionUserSchema });

export async function logIn(credentials: LoginRequest): Promise<SessionUser> {
  // A wrong password answers 401 too; it belongs on the form, not to the session-ended handler.
  const { user } = await api.post('/auth/login', credentials, {
    schema: loginResponseSchema,
    unauthorized: 'report',
  });
  return user;
}
