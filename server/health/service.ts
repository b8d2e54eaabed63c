import type { HealthRepository } from './repository';

export function createHealthService(database: HealthRepository) {
  return {
    /** Whether the database answers, and how fast (ms, one decimal). */
    async check() {
      const started = performance.now();
      try {
        await database.ping();
        return {
          status: 'ok' as const,
          database: {
            status: 'up' as const,
            latencyMs: Math.round((performance.now() - started) * 10) / 10,
          },
        };
      } catch {
        return { status: 'degraded' as const, database: { status: 'down' as const } };
      }
    },
  };
}

export type HealthService = ReturnType<typeof createHealthService>;
