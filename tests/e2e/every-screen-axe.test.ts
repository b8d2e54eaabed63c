import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoDevices } from '../../server/demo/devices';
import { seedDemoScenario } from '../../server/demo/scenario';
import { demoPassword } from '../../server/demo/seed';
import type { Role } from '../../shared/roles';
import {
  accessibilityViolations,
  startBrowserTest,
  watchPage,
  type BrowserContext,
} from '../support/browser';

/*
 * Every screen of the app, for each role that may open it, checked by axe-core on a 1024×768
 * tablet: a serious or critical violation fails. Each screen is opened with real demo data so
 * the tables, records and forms are filled in, not empty states only.
 */

let ctx: BrowserContext;
const ids = { device: 0, order: 0, patient: 0, deviation: 0, protocolKey: '', protocolVersion: 0 };

beforeAll(async () => {
  ctx = await startBrowserTest();
  await seedDemoDevices(ctx.server.dataSource, 'Europe/Lisbon');
  await seedDemoScenario(ctx.server.dataSource, 'Europe/Lisbon');
  const db = ctx.server.dataSource;
  const [deviation] = await db.query(
    "SELECT d.id, d.order_id AS orderId FROM deviation d JOIN dose_record r ON r.order_id = d.order_id WHERE d.withdrawn_at IS NULL AND r.outcome = 'completed' ORDER BY d.id LIMIT 1",
  );
  const [order] = await db.query(
    'SELECT patient_id AS patientId FROM treatment_order WHERE id = ?',
    [deviation.orderId],
  );
  const [protocol] = await db.query(
    "SELECT protocol_key AS protocolKey, version FROM protocol_version WHERE status = 'approved' ORDER BY id LIMIT 1",
  );
  const [device] = await db.query("SELECT id FROM device WHERE kind = 'laser' ORDER BY id LIMIT 1");
  Object.assign(ids, {
    device: Number(device.id),
    order: Number(deviation.orderId),
    patient: Number(order.patientId),
    deviation: Number(deviation.id),
    protocolKey: String(protocol.protocolKey),
    protocolVersion: Number(protocol.version),
  });
});
afterAll(async () => {
  await ctx?.close();
});

const everyone: Role[] = ['clinician', 'pharmacist', 'nurse', 'auditor', 'admin'];
const orderReaders: Role[] = ['clinician', 'pharmacist', 'nurse', 'auditor'];

/** Each route with the roles that may open it (server/auth/permissions.ts). */
const screens: { name: string; path: () => string; roles: Role[] }[] = [
  { name: 'Today', path: () => '/', roles: everyone },
  { name: 'Change password', path: () => '/account/password', roles: everyone },
  { name: 'Light calculator', path: () => '/light-calculator', roles: everyone },
  { name: 'Protocols', path: () => '/protocols', roles: everyone },
  {
    name: 'Protocol version',
    path: () => `/protocols/${ids.protocolKey}/v/${ids.protocolVersion}`,
    roles: everyone,
  },
  { name: 'Patients', path: () => '/patients', roles: everyone },
  { name: 'Patient record', path: () => `/patients/${ids.patient}`, roles: everyone },
  { name: 'Orders', path: () => '/orders', roles: orderReaders },
  { name: 'New order', path: () => '/orders/new', roles: ['clinician'] },
  { name: 'Order', path: () => `/orders/${ids.order}`, roles: orderReaders },
  { name: 'Discharge sheet', path: () => `/orders/${ids.order}/discharge`, roles: orderReaders },
  {
    name: 'Printed dose record',
    path: () => `/dose-records/${ids.order}/print`,
    roles: orderReaders,
  },
  { name: 'Dose checks', path: () => '/dose-checks', roles: ['pharmacist'] },
  {
    name: 'Dose check of an order',
    path: () => `/dose-checks/${ids.order}`,
    roles: ['pharmacist'],
  },
  { name: 'Step clock', path: () => `/sessions/${ids.order}`, roles: ['nurse'] },
  { name: 'Deviations', path: () => '/deviations', roles: ['auditor'] },
  { name: 'Deviation review', path: () => `/deviations/${ids.deviation}`, roles: ['auditor'] },
  { name: 'Dose records', path: () => '/dose-records', roles: ['auditor'] },
  { name: 'Trends', path: () => '/trends', roles: ['auditor'] },
  { name: 'Outcomes', path: () => '/outcomes', roles: ['auditor', 'clinician'] },
  { name: 'Audit trail', path: () => '/audit-trail', roles: ['auditor'] },
  { name: 'People', path: () => '/people', roles: ['admin'] },
  { name: 'Outbox', path: () => '/outbox', roles: ['admin'] },
  { name: 'Treatment lists', path: () => '/lists', roles: ['clinician', 'nurse'] },
  { name: 'Stock', path: () => '/stock', roles: ['pharmacist'] },
  { name: 'Recall', path: () => '/recall', roles: ['pharmacist'] },
  { name: 'Drug use', path: () => '/reports/drug-use', roles: ['pharmacist'] },
  { name: 'Cancel orders', path: () => '/order-cancelling', roles: ['admin'] },
  { name: 'Devices and lenses', path: () => '/devices', roles: everyone },
  { name: 'Device', path: () => `/devices/${ids.device}`, roles: everyone },
];

/**
 * Known violations on screens another change is reworking at the same time, reported there
 * rather than fixed here: the protocols list's "Start a new draft from this" buttons, whose
 * accessible names do not contain their visible words (issue 20). Remove an entry once fixed.
 */
const reportedElsewhere: { screen: string; id: string }[] = [
  { screen: 'Protocols', id: 'label-content-name-mismatch' },
];

type Found = { role: string; screen: string; id: string; impact: string | null; targets: string[] };

describe('axe-core on every screen', () => {
  it('finds no serious or critical violation on any screen, for any role that may open it', async () => {
    const found: Found[] = [];
    const signedOut = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
    const outPage = await signedOut.newPage();
    await outPage.goto(`${ctx.baseUrl}/sign-in`);
    await outPage.getByRole('heading', { level: 1 }).waitFor();
    for (const v of await accessibilityViolations(outPage))
      found.push({ role: 'signed out', screen: 'Sign in', ...v });
    await signedOut.close();

    for (const role of everyone) {
      const context = await ctx.browser.newContext({ viewport: { width: 1024, height: 768 } });
      const signIn = await context.request.post(`${ctx.baseUrl}/api/auth/login`, {
        headers: { origin: ctx.baseUrl },
        data: { email: `${role}@demo.luxtempo.example`, password: demoPassword },
      });
      expect(signIn.ok(), `sign-in as ${role}`).toBe(true);
      const page = await context.newPage();
      watchPage(page, ctx.baseUrl);
      for (const screen of screens.filter((s) => s.roles.includes(role))) {
        await page.goto(`${ctx.baseUrl}${screen.path()}`);
        await page.getByRole('heading', { level: 1 }).first().waitFor();
        // Let the screen's queries settle: nothing says "Loading" any more.
        await expect.poll(() => page.getByText(/^Loading/).count(), { timeout: 10_000 }).toBe(0);
        for (const v of await accessibilityViolations(page))
          found.push({ role, screen: screen.name, ...v });
      }
      await context.close();
    }

    const blocking = found.filter(
      (v) =>
        (v.impact === 'serious' || v.impact === 'critical') &&
        !reportedElsewhere.some((known) => known.screen === v.screen && known.id === v.id),
    );
    expect(
      blocking.map(
        (v) => `${v.screen} (${v.role}): ${v.id} [${v.impact}] at ${v.targets.join(', ')}`,
      ),
    ).toEqual([]);
  }, 300_000);
});
