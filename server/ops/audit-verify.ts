// npm run audit:verify [-- --database NAME] — recomputes the audit trail's hash chain and names the
// first row that does not match (exit 1), or says it is intact (exit 0).
import 'reflect-metadata';
import { verifyAuditChain } from '../audit/repository';
import { appDataSource } from '../db/options';
import { openMaintenance, runMaintenance } from './cli-database';

await runMaintenance(async () => {
  const { config, database } = await openMaintenance(process.argv.slice(2));
  // The app's own user is enough: the check only reads.
  const source = appDataSource(config);
  await source.initialize();
  try {
    const report = await verifyAuditChain(source);
    if (report.ok) {
      console.log(
        `✓ The audit trail of ${config.DB_NAME} is intact: ${report.checked} rows, each matching its hash, and the chain ends at the newest row.`,
      );
      return { code: 0, database };
    }
    const where = report.firstBrokenId ? `at row ${report.firstBrokenId}` : 'at its end';
    console.error(
      `✗ The audit trail of ${config.DB_NAME} is broken ${where}: ${report.reason} (${report.checked} rows before it are intact.)`,
    );
    return { code: 1, database };
  } finally {
    await source.destroy();
  }
});
