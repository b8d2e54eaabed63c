import type { QueryClient } from '@tanstack/react-query';
import type { VersionDetail } from '../api/protocol-response-schemas';
import { protocolQueries } from '../api/protocol-queries';

/**
 * After any change to a version: store the server's answer for its own page at once, then
 * refetch the list and that protocol's versions (a new draft changes the list and the choices
 * for comparison).
 */
export async function refreshAfterChange(
  queryClient: QueryClient,
  saved: VersionDetail,
): Promise<void> {
  queryClient.setQueryData(
    protocolQueries.version({ key: saved.key, version: saved.version }).queryKey,
    saved,
  );
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: protocolQueries.lists() }),
    queryClient.invalidateQueries({ queryKey: protocolQueries.versionsOf(saved.key) }),
  ]);
}
