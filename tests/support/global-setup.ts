import type { TestProject } from 'vitest/node';
import { buildClient } from '../../server/ops/build-client';
import { prepareTestEnvironment } from '../../server/ops/test-environment';

/**
 * `npm test` prepares the database and builds the client before vitest starts; running vitest by
 * hand (`npx vitest run --project api`) prepares them here instead.
 */
export default async function setup(project: TestProject) {
  if (process.env.LUXTEMPO_TEST_PREPARED === '1') return;
  const { database } = await prepareTestEnvironment();
  if (project.name === 'e2e') await buildClient();
  return async () => {
    await database.stop();
  };
}
