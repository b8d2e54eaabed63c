import { useQuery } from '@tanstack/react-query';
import type { Capability } from '../../../../shared/roles';
import type { SessionUser } from '../../../../shared/schemas/auth';
import { authQueries } from '../api/auth-queries';

export function useSession() {
  return useQuery(authQueries.session());
}

/** Capabilities come from the server's role table; the client only reads them. */
export function hasCapability(
  user: SessionUser | null | undefined,
  capability: Capability,
): boolean {
  return user?.capabilities.includes(capability) ?? false;
}
