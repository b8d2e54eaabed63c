import { useOutletContext } from 'react-router-dom';
import type { SessionUser } from '../../../shared/schemas/auth';

export type ShellContext = { user: SessionUser };

/** The signed-in person, for screens inside the authenticated layout (which guarantees one). */
export function useSignedInUser(): SessionUser {
  return useOutletContext<ShellContext>().user;
}
