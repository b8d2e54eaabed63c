import type { SessionUser } from '../../../../shared/schemas/auth';
import { api, isApiRequestError, lazySchema } from '../../../lib/api-client';
import { rememberWhySessionEnded } from '../../../lib/session-ended';

// Every screen asks who is signed in before it shows; the schema (and zod) loads with the answer.
const sessionUserSchema = lazySchema(() =>
  import('../../../../shared/schemas/auth').then((m) => m.sessionUserSchema),
);

/**
 * Who is signed in, or `null` when nobody is. "Not signed in" (401) is an ordinary answer here,
 * not a failure; anything else going wrong is thrown so the screen can say so.
 */
export async function getSession({
  signal,
}: { signal?: AbortSignal } = {}): Promise<SessionUser | null> {
  // The server sets this readable cookie beside the httpOnly session; without it nobody has
  // signed in on this browser, so there is nothing to ask (and no 401 in the console).
  if (!document.cookie.split('; ').includes('luxtempo_signed_in=1')) return null;
  try {
    return await api.get('/auth/me', { schema: sessionUserSchema, signal, unauthorized: 'report' });
  } catch (error) {
    if (isApiRequestError(error) && error.status === 401) {
      // A session this browser had, ended by the server (idle, signed out elsewhere): say why.
      rememberWhySessionEnded(error.message);
      return null;
    }
    throw error;
  }
}
