import path from 'node:path';
import { loadConfig, type Config } from '../../server/config';
import { appDataSource } from '../../server/db/options';
import { seedDemoData } from '../../server/demo/seed';
import { ensureDatabaseFor, recreateDatabase } from '../../server/ops/database-setup';
import { localEnvironment, localOwnerCredentials } from '../../server/ops/environment';
import { shutdownDatabaseServer } from '../../server/ops/mariadb';
import { startApiProcess as startProcess, type ApiProcess } from '../../server/ops/api-process';
import { dataDir } from '../../server/ops/paths';

export type { ApiProcess };
import { loadShippedProtocols } from '../../server/protocols/load-shipped';
import { randomUUID } from 'node:crypto';
import { expect } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
import { supersededVersionReason } from './api';
import { deviceBody, testMeter } from './devices';

/**
 * A MariaDB instance and API processes of the fault tests' own, so stopping the database or
 * killing a server never disturbs other tests. Everything listens on 127.0.0.1 only.
 */
export const faultDbPort = 3317;
export const faultDir = path.join(dataDir, 'fault-test');
const database = 'luxtempo_fault';

export function faultConfig(): Config {
  return loadConfig({
    ...localEnvironment(database),
    DB_PORT: String(faultDbPort),
    SMTP_PORT: '1126',
    DEMO_DATA: 'false',
    NODE_ENV: 'test',
  });
}

export async function startFaultDatabase(): Promise<void> {
  const config = faultConfig();
  await ensureDatabaseFor(config, localOwnerCredentials(), [database], faultDir);
}

export function stopFaultDatabase(): void {
  shutdownDatabaseServer(faultDir);
}

/** A fresh database with the schema, the shipped protocols and the demo people. */
export async function resetFaultDatabase(): Promise<void> {
  const config = faultConfig();
  await recreateDatabase(config, localOwnerCredentials());
  const app = appDataSource(config);
  await app.initialize();
  try {
    await loadShippedProtocols(app);
    await seedDemoData(app);
  } finally {
    await app.destroy();
  }
}

/** Starts the server as its own process against the fault database. */
export function startApiProcess(port: number, name: string): Promise<ApiProcess> {
  return startProcess({
    port,
    logFile: path.join(faultDir, `${name}.log`),
    env: {
      ...localEnvironment(database),
      DB_PORT: String(faultDbPort),
      SMTP_PORT: '1126',
      NODE_ENV: 'test',
      DEMO_DATA: 'false',
      LOGIN_FAILURE_LIMIT: '1000',
    },
  });
}

/** A tiny client with a cookie jar, speaking to one API process (or another, for the same person). */
export class FaultClient {
  cookie = '';
  constructor(public baseUrl: string) {}

  async signIn(email: string, password: string) {
    const res = await fetch(`${this.baseUrl}/api/auth/login`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email, password }),
    });
    if (res.status !== 200) throw new Error(`sign-in as ${email}: ${res.status}`);
    this.cookie = res.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; ');
    return this;
  }

  async call(method: string, urlPath: string, body?: unknown, baseUrl = this.baseUrl) {
    const res = await fetch(`${baseUrl}/api${urlPath}`, {
      method,
      headers: {
        Cookie: this.cookie,
        ...(body === undefined ? {} : { 'Content-Type': 'application/json' }),
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await res.text();
    let json: unknown;
    try {
      json = JSON.parse(text);
    } catch {
      json = text;
    }
    return { status: res.status, body: json as Record<string, any> };
  }
}

/** A ready CXL order for a new patient, made through the API by the demo clinician. */
export async function readyCxlOrder(base: string): Promise<number> {
  const clinician = await new FaultClient(base).signIn(
    'clinician@demo.luxtempo.example',
    demoPassword,
  );
  // A new person each time: the same name and date of birth would be a possible duplicate.
  const suffix = randomUUID().slice(0, 8);
  const patient = await clinician.call('POST', '/patients', {
    recordNumber: `F-${suffix}`,
    givenName: 'Fault',
    familyName: `Testcase ${suffix}`,
    dateOfBirth: '1970-01-01',
  });
  const draft = await clinician.call('POST', '/orders', {
    patientId: patient.body.patient.id,
    eye: 'right',
    protocol: { key: 'cxl-standard', version: 1 },
    // Version 1 is superseded by version 2; the figures here are version 1's.
    supersededVersionReason,
    inputs: { stromalThicknessUm: 470 },
    checklist: ['thin-stroma', 'active-infection', 'herpetic-keratitis'].map((id) => ({
      id,
      answer: 'no',
    })),
  });
  const signed = await clinician.call('POST', `/orders/${draft.body.order.id}/signature`, {
    password: demoPassword,
    meaning: 'ordered',
    version: draft.body.order.version,
  });
  expect(signed.body.order.status).toBe('ready');
  return draft.body.order.id;
}

/**
 * A UV source put on the register by the demo administrator, with a passing output check now
 * (3 mW/cm² set and read, the irradiance of `readyCxlOrder`'s version-1 plan: Wollensak, Am J
 * Ophthalmol 2003). Returns the `device` a session start on such an order sends.
 */
export async function readyUvSource(base: string) {
  const admin = await new FaultClient(base).signIn('admin@demo.luxtempo.example', demoPassword);
  const suffix = randomUUID().slice(0, 8);
  const added = await admin.call('POST', '/devices', {
    ...deviceBody('uv'),
    name: `Fault UV source ${suffix}`,
  });
  if (added.status !== 201) throw new Error(`adding a UV source: ${JSON.stringify(added.body)}`);
  const deviceId = added.body.device.id as number;
  const checked = await admin.call('POST', `/devices/${deviceId}/output-checks`, {
    irradianceSetMwPerCm2: 3,
    irradianceMeasuredMwPerCm2: 3,
    ...testMeter,
  });
  if (checked.status !== 201) throw new Error(`output check: ${JSON.stringify(checked.body)}`);
  return { deviceId, irradianceSetMwPerCm2: 3 };
}
