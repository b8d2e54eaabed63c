// One address and reference for a protocol version: src/lib/queries/protocols.ts.
export { versionAddress, type VersionRef } from '../../../lib/queries/protocols';
