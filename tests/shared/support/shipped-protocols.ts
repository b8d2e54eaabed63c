import { readFileSync, readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import {
  protocolVersionSchema,
  type ProtocolVersion,
} from '../../../shared/protocol/protocol-schema';

export const protocolsDir = fileURLToPath(new URL('../../../protocols/', import.meta.url));

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
