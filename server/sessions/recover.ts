import { createAuditRepository } from '../audit/repository';
import type { Clock } from '../clock';
import { createUnitOfWork, type Database } from '../db/unit-of-work';
import { createOrderRepository } from '../orders/repository';
import { createUserRepository } from '../people/repository';
import { createSessionRepository } from './repository';
import { createSessionService } from './service';

/**
 * At start-up, re-derives the record and deviations of every session still running. Events and
 * their consequences are written in one transaction, so this only repairs what another path
 * (a manual insert, an older version's crash) may have left behind; it is cheap and idempotent.
 */
export function recomputeRunningSessions(
  dataSource: Database,
  unitTimeZone: string,
  clock: Clock,
): Promise<number> {
  return createSessionService({
    unitOfWork: createUnitOfWork(dataSource),
    orders: createOrderRepository(dataSource),
    sessions: createSessionRepository(dataSource),
    users: createUserRepository(dataSource),
    audit: createAuditRepository(dataSource),
    unitTimeZone,
    clock,
  }).recomputeRunning();
}
