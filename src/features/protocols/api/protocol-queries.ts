import {
  protocolKeys,
  protocolListQuery,
  protocolVersionQuery,
} from '../../../lib/queries/protocols';

/** The protocols feature's queries: the one protocol cache (src/lib/queries/protocols.ts). */
export const protocolQueries = {
  all: protocolKeys.all,
  lists: protocolKeys.lists,
  list: protocolListQuery,
  versions: protocolKeys.versions,
  versionsOf: protocolKeys.versionsOf,
  version: protocolVersionQuery,
};
