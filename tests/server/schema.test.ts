import type { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ownerDataSource } from '../../server/db/options';
import { localOwnerCredentials } from '../../server/ops/environment';
import { testConfig } from '../support/api';

// The owner sees the whole schema (foreign keys included), as the migrations do.
let owner: DataSource;
beforeAll(async () => {
  owner = ownerDataSource(testConfig(), localOwnerCredentials());
  await owner.initialize();
});
afterAll(async () => {
  await owner.destroy();
});

describe('the database schema', () => {
  it('is exactly what the entities describe once every migration has run: no pending change', async () => {
    // TypeORM's own comparison of the entities with the live schema; a hand-written migration
    // that misses a column, a type or an index shows up here as a query still to run.
    const pending = await owner.driver.createSchemaBuilder().log();
    expect(pending.upQueries.map((q) => q.query)).toEqual([]);
  });
});
