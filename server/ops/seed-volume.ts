import { parseArgs } from 'node:util';
import { loadConfig } from '../config';
import { appDataSource } from '../db/options';
import { seedVolume } from '../demo/volume';
import { appDatabase, localEnvironment } from './environment';

// npm run seed:volume -- --records 100000   (into the app database; MariaDB must be running: npm start)
const { values } = parseArgs({
  options: { records: { type: 'string', default: '100000' }, seed: { type: 'string' } },
});
const records = Number(values.records);
if (!Number.isInteger(records) || records < 1 || records > 2_000_000) {
  console.error('--records must be a whole number from 1 to 2000000');
  process.exit(2);
}
const config = loadConfig(localEnvironment(process.env.DB_NAME ?? appDatabase));
const dataSource = appDataSource(config);
await dataSource.initialize();
const started = performance.now();
await seedVolume(dataSource, records, {
  unitTimeZone: config.UNIT_TIME_ZONE,
  seed: values.seed ? Number(values.seed) : undefined,
  onProgress: (done) => process.stdout.write(`\r  ${done} / ${records} sessions`),
});
console.log(
  `\nAdded ${records} sessions in ${((performance.now() - started) / 1000).toFixed(1)} s.`,
);
await dataSource.destroy();
