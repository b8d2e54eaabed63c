import type { DataSource } from 'typeorm';

export function createHealthRepository(dataSource: DataSource) {
  return {
    /** Resolves when the database answers a trivial query. */
    ping: async (): Promise<void> => {
      await dataSource.query('SELECT 1');
    },
  };
}

export type HealthRepository = ReturnType<typeof createHealthRepository>;
