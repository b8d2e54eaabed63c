import type { DataSource, EntityManager } from 'typeorm';

/** The app's database handle as the composition root sees it: repositories are built from it. */
export type Database = DataSource;

declare const openTransaction: unique symbol;

/**
 * An open transaction as a service sees it: a token to hand to repositories, nothing to query
 * with. Only repositories turn it back into TypeORM's EntityManager (`managerOf`).
 */
export interface Transaction {
  readonly [openTransaction]: true;
}

/** Runs `work` in one transaction: everything it writes through the repositories commits together or not at all. */
export type UnitOfWork = <T>(work: (tx: Transaction) => Promise<T>) => Promise<T>;

export function createUnitOfWork(database: Database): UnitOfWork {
  return (work) => database.transaction((manager) => work(manager as unknown as Transaction));
}

/** For repositories only: the EntityManager behind a transaction (or none, outside one). */
export function managerOf(tx: Transaction): EntityManager;
export function managerOf(tx: Transaction | undefined): EntityManager | undefined;
export function managerOf(tx: Transaction | undefined): EntityManager | undefined {
  return tx as unknown as EntityManager | undefined;
}

/** For code that already holds TypeORM's EntityManager (the demo data, migrations): the same, as a Transaction. */
export function asTransaction(manager: EntityManager): Transaction {
  return manager as unknown as Transaction;
}
