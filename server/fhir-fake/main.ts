import { demoFhirPatients } from './demo-patients';
import { startFakeFhirServer } from './fake-server';

/** `tsx server/fhir-fake/main.ts [port]`: the fake hospital FHIR server with the demo patients. */
const port = Number(process.argv[2] ?? process.env.FHIR_FAKE_PORT ?? 3090);
const fake = await startFakeFhirServer({ port, patients: demoFhirPatients() });
console.log(`Fake FHIR server (demo patients) on ${fake.url}`);
const stop = () => void fake.stop().then(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
