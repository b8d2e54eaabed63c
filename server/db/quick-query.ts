import { QueryFailedError, type DataSource } from 'typeorm';
import { managerOf, type Transaction } from './unit-of-work';

/** As much of mysql2's callback API (a pooled connection, or the pool) as one statement needs. */
interface Mysql2Queryable {
  query(sql: string, values: unknown[], done: (error: Error | null, result: unknown) => void): void;
}

function send<T>(target: Mysql2Queryable, sql: string, params: unknown[]): Promise<T> {
  return new Promise<T>((resolve, reject) =>
    target.query(sql, params, (error, result) =>
      error ? reject(new QueryFailedError(sql, params, error)) : resolve(result as T),
    ),
  );
}

/**
 * One parameterised statement sent straight through mysql2's callback API: on the connection
 * TypeORM holds for the transaction `tx`, or, without one, through TypeORM's pool. The same
 * statement, connection and result as `manager.query`, without what TypeORM adds to each
 * statement (its subscribers' broadcasts, mysql2's promise wrapper built anew, a copy of the
 * rows): a few per cent of the API's CPU on a tap (README, "Taps at a ward's pace"). A failure is
 * TypeORM's QueryFailedError, as from `query`, and the statement goes to the data source's logger
 * as TypeORM's own do (tests count statements there). For the statements a tap sends.
 */
export async function quickQuery<T>(
  database: DataSource,
  tx: Transaction | undefined,
  sql: string,
  params: unknown[],
): Promise<T> {
  const manager = tx ? managerOf(tx) : undefined;
  const runner = manager?.queryRunner;
  if (manager && runner && !runner.isReleased) {
    const connection = (await runner.connect()) as Mysql2Queryable;
    database.logger.logQuery(sql, params, runner);
    return send<T>(connection, sql, params);
  }
  if (manager) return manager.query(sql, params) as Promise<T>;
  const pool = (database.driver as unknown as { pool?: Mysql2Queryable }).pool;
  if (!pool) return database.query(sql, params) as Promise<T>;
  database.logger.logQuery(sql, params);
  return send<T>(pool, sql, params);
}
