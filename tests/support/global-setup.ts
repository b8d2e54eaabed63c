import { prepareTestEnvironment } from '../../server/ops/test-environment';

/**
 * `npm test` prepares the database before vitest starts; running vitest by hand
 * (`npx vitest run --project api`) prepares it here instead.
 */
export default async function setup() {
  if (process.env.LUXTEMPO_TEST_PREPARED === '1') return;
  const { database } = await prepareTestEnvironment();
  return async () => {
    await database.stop();
  };
}
