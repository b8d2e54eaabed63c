import { queryOptions } from '@tanstack/react-query';
import { getProtocols } from './get-protocols';
import { getProtocolVersion } from './get-protocol-version';
import type { VersionRef } from './version-address';

/** The protocols feature's query keys and options, general → specific. */
export const protocolQueries = {
  all: () => ['protocols'] as const,
  lists: () => [...protocolQueries.all(), 'list'] as const,
  list: () =>
    queryOptions({
      queryKey: [...protocolQueries.lists()] as const,
      queryFn: ({ signal }) => getProtocols({ signal }),
    }),
  versions: () => [...protocolQueries.all(), 'version'] as const,
  /** Every version of one protocol, so a change to one can refresh its siblings' comparisons. */
  versionsOf: (key: string) => [...protocolQueries.versions(), key] as const,
  version: ({ key, version }: VersionRef) =>
    queryOptions({
      queryKey: [...protocolQueries.versionsOf(key), version] as const,
      queryFn: ({ signal }) => getProtocolVersion({ key, version }, { signal }),
    }),
};
