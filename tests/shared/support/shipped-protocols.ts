import { readFileSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  protocolVersionSchema,
  type ProtocolVersion,
} from '../../../shared/protocol/protocol-schema';

/**
 * protocols/, or the directory in LUXTEMPO_PROTOCOLS_DIR: the test of DEVELOPERS.md's guide runs
 * these checks on a copy of protocols/ with a new version in it.
 */
export const protocolsDir = process.env.LUXTEMPO_PROTOCOLS_DIR
  ? `${path.resolve(process.env.LUXTEMPO_PROTOCOLS_DIR)}${path.sep}`
  : fileURLToPath(new URL('../../../protocols/', import.meta.url));

export function shippedProtocolFiles(): string[] {
  return readdirSync(protocolsDir)
    .filter((name) => name.endsWith('.json'))
    .sort();
}

export function readProtocolJson(fileName: string): unknown {
  return JSON.parse(readFileSync(`${protocolsDir}${fileName}`, 'utf8'));
}

/** A shipped protocol, validated; throws with zod's issues if the file is invalid. */
export function loadProtocol(key: string, version = 1): ProtocolVersion {
  return protocolVersionSchema.parse(readProtocolJson(`${key}.v${version}.json`));
}

/** A deep copy to alter in a test without touching the shared object. */
export function copyOf<T>(value: T): T {
  return structuredClone(value);
}
