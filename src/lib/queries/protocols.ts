import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../api-client';
import {
  protocolSummarySchema,
  versionResponseSchema,
  type ProtocolSummary,
  type VersionDetail,
} from './protocol-schemas';
import type { Fetching } from './request';

/*
 * One cache for protocols: the list (every protocol with its versions) and each version with its
 * definition. The order form, the pharmacist's check, the step clock, the reviews and the
 * protocol screens all read these.
 */

export type VersionRef = { key: string; version: number };

/** The API address of one protocol version; keys and numbers are encoded, never trusted as typed. */
export function versionAddress(key: string, version: number): string {
  return `/protocols/${encodeURIComponent(key)}/versions/${encodeURIComponent(String(version))}`;
}

const protocolsResponseSchema = z.object({ protocols: z.array(protocolSummarySchema) });

export const protocolKeys = {
  all: () => ['protocols'] as const,
  lists: () => [...protocolKeys.all(), 'list'] as const,
  versions: () => [...protocolKeys.all(), 'version'] as const,
  /** Every version of one protocol, so a change to one can refresh its siblings' comparisons. */
  versionsOf: (key: string) => [...protocolKeys.versions(), key] as const,
  version: ({ key, version }: VersionRef) => [...protocolKeys.versionsOf(key), version] as const,
};

export async function getProtocols({ signal }: Fetching = {}): Promise<ProtocolSummary[]> {
  const { protocols } = await api.get('/protocols', { schema: protocolsResponseSchema, signal });
  return protocols;
}

export async function getProtocolVersion(
  { key, version }: VersionRef,
  { signal }: Fetching = {},
): Promise<VersionDetail> {
  const response = await api.get(versionAddress(key, version), {
    schema: versionResponseSchema,
    signal,
  });
  return response.version;
}

export const protocolListQuery = () =>
  queryOptions({
    queryKey: protocolKeys.lists(),
    queryFn: ({ signal }) => getProtocols({ signal }),
  });

export const protocolVersionQuery = (ref: VersionRef) =>
  queryOptions({
    queryKey: protocolKeys.version(ref),
    queryFn: ({ signal }) => getProtocolVersion(ref, { signal }),
  });
