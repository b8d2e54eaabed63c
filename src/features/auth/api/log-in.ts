import type { LoginRequest, SessionUser } from '../../../../shared/schemas/auth';
import { api, lazySchema } from '../../../lib/api-client';

// Loaded with the request, not with the sign-in page.
const loginResponseSchema = lazySchema(() =>
  import('./login-response').then((m) => m.loginResponseSchema),
);

export async function logIn(credentials: LoginRequest): Promise<SessionUser> {
  // A wrong password answers 401 too; it belongs on the form, not to the session-ended handler.
  const { user } = await api.post('/auth/login', credentials, {
    schema: loginResponseSchema,
    unauthorized: 'report',
  });
  return user;
}
