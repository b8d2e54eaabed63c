import { createHash } from 'node:crypto';
import { canonicalJson } from '../../shared/protocol/canonical-json';
import type { ProtocolVersion as ProtocolDefinition } from '../../shared/protocol/protocol-schema';
import { AppError } from '../http/app-error';

/** The fingerprint of a protocol definition: SHA-256 of its canonical JSON. */
export function definitionSha256(definition: ProtocolDefinition): string {
  return createHash('sha256').update(canonicalJson(definition)).digest('hex');
}

/**
 * Refuses to go on with an order whose protocol definition, as read now, is not the one it was
 * planned on. The database refuses such a change; this catches one made around it (a restore gone
 * wrong, a hand edit as the owner), before a dose or a light setting is read from it.
 */
export function checkOrderedDefinition(
  order: { id: number; protocolSha256: string },
  actualSha256: string,
): void {
  if (actualSha256 !== order.protocolSha256) {
    throw AppError.conflict(
      'protocol_fingerprint_mismatch',
      `Order ${order.id}: its protocol version no longer matches the fingerprint stored when it was planned. Do not treat from this order; ask the administrator to check the protocol versions.`,
    );
  }
}
