import type { Config } from '../config';
import { migrateDatabase } from '../db/migrate';
import { appDataSource, type OwnerCredentials } from '../db/options';
import { seedDemoDevices } from '../demo/devices';
import { seedDemoFollowUp } from '../demo/follow-up';
import { seedDemoListsAndStock } from '../demo/lists-and-stock';
import { seedDemoScenario } from '../demo/scenario';
import { demoPassword, demoPeople, retireDemoPeople, seedDemoData } from '../demo/seed';
import { loadShippedProtocols } from '../protocols/load-shipped';

/**
 * Runs pending migrations as the owner, then loads the shipped protocols and the demo unit (or,
 * with demo data off, deactivates the demo people). Run once per database, before any web
 * process starts: `npm start` does it for its one server, `npm run cluster` once for the cluster.
 */
export async function prepareAppDatabase(config: Config, owner: OwnerCredentials): Promise<void> {
  const ran = await migrateDatabase(config, owner);
  console.log(
    ran.length ? `• Migrations run: ${ran.join(', ')}` : '• Database schema is up to date',
  );
  const source = appDataSource(config);
  await source.initialize();
  try {
    if (config.DEMO_DATA) {
      const { created } = await seedDemoData(source);
      await loadShippedProtocols(source);
      const deviceRows = await seedDemoDevices(source, config.UNIT_TIME_ZONE);
      if (deviceRows)
        console.log(`• Demo devices, lenses and output checks: ${deviceRows} rows added`);
      const sessions = await seedDemoScenario(source, config.UNIT_TIME_ZONE);
      const visits = await seedDemoFollowUp(source, config.UNIT_TIME_ZONE);
      const listed = await seedDemoListsAndStock(source, config.UNIT_TIME_ZONE);
      if (listed) console.log(`• Demo lists and stock added (${listed} rows)`);
      if (visits) console.log(`• Demo follow-up visits recorded: ${visits}`);
      console.log(
        created.length || sessions
          ? `• Demo data added (${created.length} people and patients, ${sessions} orders)`
          : '• Demo data already present',
      );
      return;
    }
    // Demo people have a published password: with demo data off, none of them may sign in.
    const retired = await retireDemoPeople(source);
    if (retired) console.log(`• Demo data is off: ${retired} demo people deactivated`);
    const [{ admins }] = await source.query(
      "SELECT COUNT(*) AS admins FROM user WHERE active = 1 AND FIND_IN_SET('admin', roles)",
    );
    if (Number(admins) === 0)
      console.log(
        '• Nobody can sign in yet: create the first administrator with\n    npm run admin:create -- --email you@hospital.example --name "Your Name"',
      );
  } finally {
    await source.destroy();
  }
}

/** The demo sign-ins, for the ready message (empty with demo data off). */
export function demoSignIns(config: Config): string {
  return config.DEMO_DATA
    ? `\nDemo sign-ins (password for all: ${demoPassword}):\n${demoPeople.map((p) => `  ${p.email.padEnd(40)} ${p.roles.join(' + ')}`).join('\n')}\n`
    : '';
}
