import type { DataSource } from 'typeorm';

/** Tables whose rows, once written, stay as written: the app may add and read, never change. */
export const appendOnlyTables = new Set([
  'audit_event',
  'dose_check',
  'session_event',
  'deviation_review',
  'preparation',
  'protocol_approval',
  'patient_measurement',
  'device_version',
  'output_check',
  'stock_movement',
  'preparation_stock',
]);

/** Tables the app may read and change but never add to or delete from (a single row kept up to date). */
export const updateOnlyTables = new Set(['audit_chain_head']);

/**
 * Gives the app's database user rights table by table, after migrations. MariaDB rights only
 * add up, so a database-wide grant could not be narrowed for the audit table; listing tables is
 * how that table stays append-only for the running app.
 */
export async function grantAppUserRights(owner: DataSource, appUser: string): Promise<void> {
  const database = owner.options.database as string;
  const tables: { name: string }[] = await owner.query(
    'SELECT table_name AS name FROM information_schema.tables WHERE table_schema = ? AND table_type = ?',
    [database, 'BASE TABLE'],
  );
  for (const host of ['127.0.0.1', 'localhost']) {
    for (const { name } of tables) {
      const rights = appendOnlyTables.has(name)
        ? 'SELECT, INSERT'
        : updateOnlyTables.has(name)
          ? 'SELECT, UPDATE'
          : 'SELECT, INSERT, UPDATE, DELETE';
      if (appendOnlyTables.has(name) || updateOnlyTables.has(name)) {
        // A right granted before a table became append-only must not linger.
        await owner
          .query(`REVOKE INSERT, UPDATE, DELETE ON \`${database}\`.\`${name}\` FROM ?@?`, [
            appUser,
            host,
          ])
          .catch(() => undefined);
      }
      await owner.query(`GRANT ${rights} ON \`${database}\`.\`${name}\` TO ?@?`, [appUser, host]);
    }
  }
}
