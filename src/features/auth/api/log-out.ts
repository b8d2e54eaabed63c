import { api, isApiRequestError } from '../../../lib/api-client';

export async function logOut(): Promise<void> {
  try {
    await api.post<void>('/auth/logout', undefined, { unauthorized: 'report' });
  } catch (error) {
    // Already signed out on the server (expired session): the person's goal is met.
    if (isApiRequestError(error) && error.status === 401) return;
    throw error;
  }
}
