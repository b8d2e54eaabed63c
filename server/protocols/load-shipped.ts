import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createAuditRepository } from '../audit/repository';
import { systemClock, type Clock } from '../clock';
import type { Database } from '../db/unit-of-work';
import { createProtocolRepository } from './repository';
import { createProtocolService } from './service';

export const shippedProtocolsDir = path.resolve(
  path.dirname(fileURLToPath(import.meta.url)),
  '../../protocols',
);

/** Validates and stores the files in protocols/; throws, naming the file, on anything wrong. */
export function loadShippedProtocols(
  dataSource: Database,
  directory = shippedProtocolsDir,
  clock: Clock = systemClock,
) {
  return createProtocolService(
    createProtocolRepository(dataSource),
    createAuditRepository(dataSource),
    // Loading shipped files signs nothing: any signature asked for here is refused.
    async () => false,
    clock,
  ).loadShippedFiles(directory);
}
