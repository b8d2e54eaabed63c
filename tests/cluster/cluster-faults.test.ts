import path from 'node:path';
import { readFileSync, rmSync, statSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword } from '../../server/demo/seed';
import { clusterSettings, startCluster, type RunningCluster } from '../../server/ops/cluster-rig';
import { galeraPaths, nodeConnection, readNodeState, takesWrites } from '../../server/ops/galera';
import { serverStates } from '../../server/ops/haproxy';
import { dataDir } from '../../server/ops/paths';
import { FaultClient, readyCxlOrder } from '../support/fault-rig';
import { keepTapping, storedKeys, tabletsFor, waitFor, type Tablet } from '../support/cluster-kit';

// A cluster of the tests' own (fresh data under .data/cluster-test/) on the cluster's ports:
// `npm run cluster` must not be running at the same time (the start says so if it is).
const settings = clusterSettings({
  ...process.env,
  CLUSTER_DIR: path.join(dataDir, 'cluster-test'),
});
let cluster: RunningCluster;

beforeAll(async () => {
  rmSync(settings.dir, { recursive: true, force: true });
  cluster = await startCluster(settings, { mailCatcher: false });
}, 300_000);

afterAll(async () => {
  await cluster?.stop();
}, 120_000);

const apiUrl = (i: number) => `http://127.0.0.1:${settings.apiPorts[i]}`;

/** Every tap a tablet made is stored exactly once, the same on every node. */
async function expectEachTapOnceOnEveryNode(tablets: Tablet[]) {
  for (const tablet of tablets) {
    expect(tablet.refused).toEqual([]);
    expect(tablet.miscounted).toEqual([]);
    const made = tablet.made.map((t) => t.idempotencyKey).sort();
    for (const node of settings.nodes)
      expect(await storedKeys(node, settings.database, tablet.orderId)).toEqual(made);
  }
}

describe('two API processes over one database share what must be shared', () => {
  it('counts failed sign-ins in both: the limit is reached across them, not in each', async () => {
    const email = `nobody-${Date.now()}@demo.luxtempo.example`;
    // An address of its own (HAProxy's way of saying who connected), so no other test is slowed.
    const from = `10.${Date.now() % 250}.7.9`;
    const attempt = (i: number) =>
      fetch(`${apiUrl(i % 2)}/api/auth/login`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-Forwarded-For': from },
        body: JSON.stringify({ email, password: 'not-the-password' }),
      });
    // LOGIN_FAILURE_LIMIT is 10 by default: five failures on each process.
    for (let i = 0; i < 10; i++) expect((await attempt(i)).status).toBe(401);
    expect((await attempt(10)).status).toBe(429);
    expect((await attempt(11)).status).toBe(429);
  });

  it('honours a sign-out made through the other process at once', async () => {
    const nurse = await new FaultClient(apiUrl(0)).signIn(
      'nurse@demo.luxtempo.example',
      demoPassword,
    );
    // The second process has checked this token already (and remembers its signature is good).
    expect((await nurse.call('GET', '/auth/me', undefined, apiUrl(1))).status).toBe(200);
    expect((await nurse.call('POST', '/auth/logout', {}, apiUrl(0))).status).toBeLessThan(300);
    expect((await nurse.call('GET', '/auth/me', undefined, apiUrl(1))).status).toBe(401);
  });

  it('uses a protocol version approved through the other process for the very next calculation', async () => {
    const admin = await new FaultClient(apiUrl(0)).signIn(
      'admin@demo.luxtempo.example',
      demoPassword,
    );
    const clinician = await new FaultClient(apiUrl(0)).signIn(
      'clinician@demo.luxtempo.example',
      demoPassword,
    );
    const pharmacist = await new FaultClient(apiUrl(0)).signIn(
      'pharmacist@demo.luxtempo.example',
      demoPassword,
    );
    const calculate = () =>
      clinician.call(
        'POST',
        '/calculations',
        {
          protocol: { key: 'pdt-half-time' },
          // Invented figures within the protocol's ranges (demo data).
          inputs: {
            height: { value: 170, unit: 'cm' },
            weight: { value: 70, unit: 'kg' },
            lesionGldUm: 2500,
            lensMagnification: 1,
          },
        },
        apiUrl(1),
      );
    const before = await calculate();
    expect(before.status).toBe(200);
    const newest = before.body.protocol.version as number;
    const draft = await admin.call('POST', '/protocols/drafts', {
      from: { key: 'pdt-half-time', version: newest },
    });
    expect(draft.status).toBe(201);
    const next = draft.body.version.version as number;
    const approve = (who: FaultClient) =>
      who.call('POST', `/protocols/pdt-half-time/versions/${next}/approvals`, {
        password: demoPassword,
        meaning: 'approved-for-use',
      });
    expect((await approve(clinician)).status).toBe(201);
    // The other process has just answered with the older version…
    expect((await calculate()).body.protocol.version).toBe(newest);
    expect((await approve(pharmacist)).body.version.status).toBe('approved');
    // …and uses the new one for the very next calculation.
    expect((await calculate()).body.protocol.version).toBe(next);
    const retired = await admin.call(
      'POST',
      `/protocols/pdt-half-time/versions/${next}/retirement`,
      {
        reason: 'Cluster test: the change is undone',
      },
    );
    expect(retired.status).toBe(200);
    expect((await calculate()).body.protocol.version).toBe(newest);
  });
});

describe('faults with sessions running and taps arriving', () => {
  it('(b) an API process killed: HAProxy routes around it and the queued taps land once', async () => {
    const tablets = await tabletsFor(cluster.url, readyCxlOrder, 3);
    const tapping = keepTapping(tablets, 150);
    await new Promise((r) => setTimeout(r, 1_500));
    await cluster.killApi(0);
    const killedAt = Date.now();
    await waitFor('HAProxy to mark api1 down', async () => {
      return (await serverStates(settings.dir))['api/api1']?.startsWith('DOWN') ?? false;
    });
    const markedDownAt = Date.now();
    await new Promise((r) => setTimeout(r, 3_000));
    await tapping.stop();
    await expectEachTapOnceOnEveryNode(tablets);
    // Once HAProxy knew, no tap needed a second try: every answer after that was a stored one.
    const after = tablets.flatMap((t) => t.answers.filter((a) => a.at > markedDownAt + 200));
    expect(after.length).toBeGreaterThan(10);
    expect(after.every((a) => a.status === 201)).toBe(true);
    expect(markedDownAt - killedAt).toBeLessThan(5_000);
    await cluster.startApi(0);
    await waitFor('HAProxy to use api1 again', async () => {
      return (await serverStates(settings.dir))['api/api1'] === 'UP';
    });
  });

  it('(a) a database node killed and restarted: nothing lost or doubled, it rejoins and catches up', async () => {
    const tablets = await tabletsFor(cluster.url, readyCxlOrder, 3);
    const tapping = keepTapping(tablets, 150);
    await new Promise((r) => setTimeout(r, 1_000));
    const node3 = settings.nodes[2]!;
    await cluster.killNode(2);
    await waitFor('node1 to see the cluster without node3', async () => {
      return (await readNodeState(settings.nodes[0]!)).clusterSize === 2;
    });
    await new Promise((r) => setTimeout(r, 3_000));
    const logFrom = statSync(galeraPaths(node3.dir).errorLog).size;
    await cluster.startNode(2);
    expect(takesWrites(await readNodeState(node3))).toBe(true);
    // It caught up from the others' cache of recent writes (IST), not by a full copy.
    const log = readFileSync(galeraPaths(node3.dir).errorLog, 'utf8').slice(logFrom);
    expect(log).toMatch(/IST received/);
    await new Promise((r) => setTimeout(r, 1_000));
    await tapping.stop();
    await expectEachTapOnceOnEveryNode(tablets);
  });

  it('(c) the writing node lost mid-transaction: the tablet sends again and the key keeps one row', async () => {
    const tablets = await tabletsFor(cluster.url, readyCxlOrder, 3);
    const tapping = keepTapping(tablets.slice(1), 150);
    const [held] = tablets;
    const node1 = settings.nodes[0]!;
    // Hold the order's row on the writing node, so the next tap's transaction starts and waits.
    const blocker = await nodeConnection(node1);
    await blocker.query('BEGIN');
    await blocker.query(
      `SELECT id FROM \`${settings.database}\`.treatment_order WHERE id = ? FOR UPDATE`,
      [held!.orderId],
    );
    const tap = held!.drop();
    await waitFor('the tap to be waiting inside its transaction on node1', async () => {
      const [rows] = await blocker.query(
        "SELECT COUNT(*) AS n FROM information_schema.innodb_trx WHERE trx_state = 'LOCK WAIT'",
      );
      return Number((rows as { n: number }[])[0]!.n) > 0;
    });
    await cluster.killNode(0);
    blocker.destroy();
    await held!.drained(60_000);
    for (let i = 0; i < 5; i++) held!.drop();
    await new Promise((r) => setTimeout(r, 2_000));
    // The first answer for that tap was a failure; a later try stored it.
    expect(held!.answers.some((a) => a.status !== 201 && a.status !== 200)).toBe(true);
    await cluster.startNode(0);
    await new Promise((r) => setTimeout(r, 3_000));
    await tapping.stop();
    await held!.drained(30_000);
    await expectEachTapOnceOnEveryNode(tablets);
    expect(await storedKeys(settings.nodes[1]!, settings.database, held!.orderId)).toContain(
      tap.idempotencyKey,
    );
    // Writes are back on node1 alone once it has caught up.
    const states = await serverStates(settings.dir);
    expect(states['database/node1']).toBe('UP');
  });
});
