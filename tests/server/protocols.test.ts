import { randomUUID } from 'node:crypto';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadShippedProtocols, shippedProtocolsDir } from '../../server/protocols/load-shipped';
import { ownerConnection } from '../support/database';
import {
  createTestPatient,
  createTestPerson,
  cxlOrder,
  signOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
} from '../support/api';
import { readyBench } from '../support/devices';

let ctx: TestContext;
let bench: Awaited<ReturnType<typeof readyBench>>;
beforeAll(async () => {
  ctx = await startTestApp();
  bench = await readyBench(await signedInAgent(ctx, await createTestPerson(ctx, ['admin'])));
});
afterAll(async () => {
  await ctx.close();
});

const shippedKeys = [
  'cxl-accelerated',
  'cxl-accelerated-pulsed',
  'cxl-standard',
  'pdt-half-dose',
  'pdt-half-fluence',
  'pdt-half-time',
  'pdt-standard',
];

function shippedDefinition(file: string) {
  return JSON.parse(readFileSync(path.join(shippedProtocolsDir, file), 'utf8'));
}

/** A valid new protocol to import: the standard PDT file under a key of the test's own. */
function importable(overrides: Record<string, unknown> = {}) {
  const key = `pdt-test-${randomUUID().slice(0, 8)}`;
  return {
    ...shippedDefinition('pdt-standard.v1.json'),
    key,
    version: 1,
    approval: null,
    ...overrides,
  };
}

/** An approval is an electronic signature: the approver's password and its meaning. */
function approvalBy(person: TestPerson) {
  return { password: person.password, meaning: 'approved-for-use' };
}

async function importAs(
  agent: ReturnType<typeof supertest.agent>,
  definition: object,
  name = 'protocol.json',
) {
  return agent
    .post('/api/protocols/imports')
    .attach('file', Buffer.from(JSON.stringify(definition)), {
      filename: name,
      contentType: 'application/json',
    });
}

describe('shipped protocol versions', () => {
  it('every signed-in role can list them, each as an approved version 1', async () => {
    const nurse = await createTestPerson(ctx, ['nurse']);
    const res = await (await signedInAgent(ctx, nurse)).get('/api/protocols');
    expect(res.status).toBe(200);
    const keys = res.body.protocols.map((p: { key: string }) => p.key);
    expect(keys).toEqual(expect.arrayContaining(shippedKeys));
    const standard = res.body.protocols.find((p: { key: string }) => p.key === 'pdt-standard');
    expect(standard.versions[0]).toMatchObject({
      version: 1,
      status: 'approved',
      origin: 'shipped',
      kind: 'pdt',
    });
    expect(standard.versions[0].sha256).toMatch(/^[0-9a-f]{64}$/);
  });

  it('a version detail carries every parameter and its sources', async () => {
    const clinician = await createTestPerson(ctx, ['clinician']);
    const res = await (
      await signedInAgent(ctx, clinician)
    ).get('/api/protocols/pdt-standard/versions/1');
    expect(res.status).toBe(200);
    const definition = res.body.version.definition;
    // Source: TAP Study Group, Arch Ophthalmol 1999 — 6 mg/m², 600 mW/cm², 83 s, 50 J/cm², light at 15 min.
    expect(definition.drug.doseMgPerM2).toBe(6);
    expect(definition.light).toMatchObject({
      irradianceMwPerCm2: 600,
      exposureS: 83,
      targetFluenceJPerCm2: 50,
    });
    expect(definition.timing.lightStartAfterInfusionStartMin).toBe(15);
    expect(definition.sources.map((s: { citation: string }) => s.citation).join(' ')).toMatch(
      /TAP/,
    );
  });

  it('an unknown protocol or version is 404, a malformed version 400', async () => {
    const nurse = await createTestPerson(ctx, ['nurse']);
    const agent = await signedInAgent(ctx, nurse);
    expect((await agent.get('/api/protocols/pdt-standard/versions/99')).status).toBe(404);
    expect((await agent.get('/api/protocols/no-such-protocol/versions/1')).status).toBe(404);
    const bad = await agent.get('/api/protocols/pdt-standard/versions/first');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('version');
  });

  it('loading the same files again changes nothing', async () => {
    const before = await ctx.dataSource.query('SELECT COUNT(*) AS n FROM protocol_version');
    const result = await loadShippedProtocols(ctx.dataSource);
    expect(result.added).toEqual([]);
    expect(result.unchanged).toBeGreaterThanOrEqual(shippedKeys.length);
    expect(await ctx.dataSource.query('SELECT COUNT(*) AS n FROM protocol_version')).toEqual(
      before,
    );
  });

  it('a file whose content differs from its approved stored version refuses start-up, naming the file', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'luxtempo-protocols-'));
    const tampered = shippedDefinition('pdt-standard.v1.json');
    tampered.summary = `${tampered.summary} (edited in place)`;
    writeFileSync(path.join(dir, 'pdt-standard.v1.json'), JSON.stringify(tampered));
    await expect(loadShippedProtocols(ctx.dataSource, dir)).rejects.toThrow(
      /pdt-standard\.v1\.json differs from the pdt-standard version 1 already stored/,
    );
  });

  it('a file that breaks the schema refuses start-up, naming the file and the field', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'luxtempo-protocols-'));
    const broken = shippedDefinition('cxl-standard.v1.json');
    broken.light.irradianceMwPerCm2 = -3;
    writeFileSync(path.join(dir, 'cxl-standard.v1.json'), JSON.stringify(broken));
    await expect(loadShippedProtocols(ctx.dataSource, dir)).rejects.toThrow(
      /cxl-standard\.v1\.json is not a valid protocol version[\s\S]*light\.irradianceMwPerCm2/,
    );
  });

  it('the database itself refuses to change an approved version', async () => {
    await expect(
      ctx.dataSource.query(
        "UPDATE protocol_version SET sha256 = REPEAT('0', 64) WHERE protocol_key = 'pdt-standard' AND version = 1",
      ),
    ).rejects.toThrow(/cannot be changed/);
    await expect(
      ctx.dataSource.query(
        "DELETE FROM protocol_version WHERE protocol_key = 'pdt-standard' AND version = 1",
      ),
    ).rejects.toThrow(/cannot be deleted/);
  });

  it('the database refuses to take an approved version back to draft, where its definition could be edited', async () => {
    await expect(
      ctx.dataSource.query(
        "UPDATE protocol_version SET status = 'draft' WHERE protocol_key = 'pdt-standard' AND version = 1",
      ),
    ).rejects.toThrow(/back to draft/);
    const [row] = await ctx.dataSource.query(
      "SELECT status FROM protocol_version WHERE protocol_key = 'pdt-standard' AND version = 1",
    );
    expect(row.status).toBe('approved');
  });
});

describe('an order and the version it was planned on', () => {
  it("keeps the version's SHA-256, and refuses to be read or run once what it points at no longer matches", async () => {
    const clinician = await createTestPerson(ctx, ['clinician']);
    const clinicianAgent = await signedInAgent(ctx, clinician);
    const nurseAgent = await signedInAgent(ctx, await createTestPerson(ctx, ['nurse']));
    const patient = await createTestPatient(ctx);
    const signed = await signOrder(clinicianAgent, clinician, cxlOrder(patient.id));
    const [stored] = await ctx.dataSource.query(
      'SELECT o.protocol_sha256 AS kept, v.sha256 AS version FROM treatment_order o JOIN protocol_version v ON v.id = o.protocol_version_id WHERE o.id = ?',
      [signed.id],
    );
    expect(stored.kept).toMatch(/^[0-9a-f]{64}$/);
    expect(stored.kept).toBe(stored.version);

    // What a change made around the database's own refusals looks like from the order's side: the
    // owner takes the signed-order trigger away, changes the fingerprint, and puts the trigger back.
    const owner = await ownerConnection(ctx.config);
    try {
      const [[trigger]] = (await owner.query(
        'SHOW CREATE TRIGGER treatment_order_signed_kept',
      )) as unknown as [Record<string, string>[]];
      await owner.query('DROP TRIGGER treatment_order_signed_kept');
      try {
        await owner.query(
          "UPDATE treatment_order SET protocol_sha256 = REPEAT('a', 64) WHERE id = ?",
          [signed.id],
        );
      } finally {
        await owner.query(trigger!['SQL Original Statement']!);
      }
    } finally {
      await owner.end();
    }
    const read = await clinicianAgent.get(`/api/orders/${signed.id}`);
    expect(read.status).toBe(409);
    expect(read.body.error.code).toBe('protocol_fingerprint_mismatch');
    const start = await nurseAgent.post(`/api/orders/${signed.id}/session-events`).send({
      idempotencyKey: randomUUID(),
      clientTime: new Date().toISOString(),
      type: 'session-started',
      checks: {
        patientIdentity: true,
        treatmentEye: true,
        consent: true,
        eyewear: true,
        deviceSettings: true,
      },
      device: bench.deviceFor(signed),
    });
    expect(start.status).toBe(409);
    expect(start.body.error.code).toBe('protocol_fingerprint_mismatch');
    const [events] = await ctx.dataSource.query(
      'SELECT COUNT(*) AS n FROM session_event WHERE order_id = ?',
      [signed.id],
    );
    expect(Number(events.n)).toBe(0);
  });
});

describe('importing and approving a protocol version', () => {
  it('an admin imports a JSON file as a draft; it is audited', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const definition = importable();
    const res = await importAs(await signedInAgent(ctx, admin), definition);
    expect(res.status).toBe(201);
    expect(res.body.version).toMatchObject({
      key: definition.key,
      version: 1,
      status: 'draft',
      origin: 'imported',
      approvals: [],
    });
    const audit = await ctx.dataSource.query(
      "SELECT action FROM audit_event WHERE action = 'protocol.imported' AND JSON_VALUE(details, '$.key') = ?",
      [definition.key],
    );
    expect(audit).toHaveLength(1);
  });

  it('an import is checked by content: not JSON, or not a valid protocol, is a 400 naming the problem', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const agent = await signedInAgent(ctx, admin);
    const notJson = await agent
      .post('/api/protocols/imports')
      .attach('file', Buffer.from('%PDF-1.7 not json'), {
        filename: 'looks-like.json',
        contentType: 'application/json',
      });
    expect(notJson.status).toBe(400);
    expect(notJson.body.error.fields[0].path).toBe('file');
    const invalid = await importAs(
      agent,
      importable({ drug: { ...shippedDefinition('pdt-standard.v1.json').drug, doseMgPerM2: 0 } }),
    );
    expect(invalid.status).toBe(400);
    expect(invalid.body.error.fields.map((f: { path: string }) => f.path)).toContain(
      'drug.doseMgPerM2',
    );
    const missing = await agent.post('/api/protocols/imports');
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields[0].path).toBe('file');
  });

  it('an import that carries its own approval, or reuses an existing key and version, is refused', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const agent = await signedInAgent(ctx, admin);
    const withApproval = await importAs(
      agent,
      importable({ approval: shippedDefinition('pdt-standard.v1.json').approval }),
    );
    expect(withApproval.status).toBe(400);
    const existing = await importAs(agent, {
      ...shippedDefinition('pdt-standard.v1.json'),
      approval: null,
    });
    expect(existing.status).toBe(409);
  });

  it('a nurse cannot import, and a nurse cannot approve', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const nurse = await createTestPerson(ctx, ['nurse']);
    const nurseAgent = await signedInAgent(ctx, nurse);
    expect((await importAs(nurseAgent, importable())).status).toBe(403);
    const definition = importable();
    await importAs(await signedInAgent(ctx, admin), definition);
    expect(
      (await nurseAgent.post(`/api/protocols/${definition.key}/versions/1/approvals`)).status,
    ).toBe(403);
  });

  it('it becomes approved only when two different people approve it; the same person twice does not count', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const clinician = await createTestPerson(ctx, ['clinician']);
    const pharmacist = await createTestPerson(ctx, ['pharmacist']);
    const definition = importable();
    await importAs(await signedInAgent(ctx, admin), definition);
    const url = `/api/protocols/${definition.key}/versions/1/approvals`;
    const clinicianAgent = await signedInAgent(ctx, clinician);

    const first = await clinicianAgent.post(url).send(approvalBy(clinician));
    expect(first.status).toBe(201);
    expect(first.body.version.status).toBe('draft');
    expect(first.body.version.approvals).toHaveLength(1);

    const again = await clinicianAgent.post(url).send(approvalBy(clinician));
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already_approved');

    const second = await (
      await signedInAgent(ctx, pharmacist)
    )
      .post(url)
      .send(approvalBy(pharmacist));
    expect(second.status).toBe(201);
    expect(second.body.version.status).toBe('approved');
    expect(
      second.body.version.approvals.map((a: { approvedAs: string }) => a.approvedAs).sort(),
    ).toEqual(['clinician', 'pharmacist']);

    const actions = await ctx.dataSource.query(
      "SELECT action FROM audit_event WHERE entity_type = 'protocol_version' AND JSON_VALUE(details, '$.key') = ? ORDER BY id",
      [definition.key],
    );
    expect(actions.map((r: { action: string }) => r.action)).toEqual([
      'protocol.imported',
      'protocol.approval-given',
      'protocol.approved',
    ]);
  });

  it('an approved version can be retired by an admin: it stays readable, and the newest approved version is used instead', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const approvers = [
      await createTestPerson(ctx, ['clinician']),
      await createTestPerson(ctx, ['pharmacist']),
    ];
    const adminAgent = await signedInAgent(ctx, admin);
    const v1 = importable();
    const v2 = { ...v1, version: 2, title: `${v1.title} (second)` };
    for (const definition of [v1, v2]) {
      expect((await importAs(adminAgent, definition)).status).toBe(201);
      for (const approver of approvers)
        await (
          await signedInAgent(ctx, approver)
        )
          .post(`/api/protocols/${v1.key}/versions/${definition.version}/approvals`)
          .send(approvalBy(approver));
    }
    const clinicianAgent = await signedInAgent(ctx, approvers[0]!);
    const calculate = () =>
      clinicianAgent.post('/api/calculations').send({
        protocol: { key: v1.key },
        inputs: {
          height: { value: 170, unit: 'cm' },
          weight: { value: 70, unit: 'kg' },
          lesionGldUm: 2500,
          lensMagnification: 1,
        },
      });
    // A retirement counts for the very next calculation (no process keeps an older answer).
    expect((await calculate()).body.protocol.version).toBe(2);
    const noReason = await adminAgent
      .post(`/api/protocols/${v1.key}/versions/2/retirement`)
      .send({});
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields[0].path).toBe('reason');
    const retired = await adminAgent
      .post(`/api/protocols/${v1.key}/versions/2/retirement`)
      .send({ reason: 'Superseded by unit policy review' });
    expect(retired.status).toBe(200);
    expect(retired.body.version.status).toBe('retired');
    expect((await adminAgent.get(`/api/protocols/${v1.key}/versions/2`)).body.version.status).toBe(
      'retired',
    );

    const plan = await calculate();
    expect(plan.status).toBe(200);
    expect(plan.body.protocol.version).toBe(1);
  });

  it('an admin clones a version into a new draft numbered after the highest, and edits it before approval', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const agent = await signedInAgent(ctx, admin);
    const original = importable();
    await importAs(agent, original);
    const draft = await agent
      .post('/api/protocols/drafts')
      .send({ from: { key: original.key, version: 1 } });
    expect(draft.status).toBe(201);
    expect(draft.body.version).toMatchObject({
      key: original.key,
      version: 2,
      status: 'draft',
      origin: 'cloned',
    });

    const edited = { ...draft.body.version.definition, summary: 'Edited summary for the site.' };
    const saved = await agent
      .put(`/api/protocols/${original.key}/versions/2`)
      .send({ definition: edited });
    expect(saved.status).toBe(200);
    expect(saved.body.version.definition.summary).toBe('Edited summary for the site.');
    expect(saved.body.version.sha256).not.toBe(draft.body.version.sha256);

    const broken = await agent
      .put(`/api/protocols/${original.key}/versions/2`)
      .send({ definition: { ...edited, light: { ...edited.light, exposureS: -1 } } });
    expect(broken.status).toBe(400);
    expect(broken.body.error.fields.map((f: { path: string }) => f.path)).toContain(
      'definition.light.exposureS',
    );

    const shipped = await agent
      .put('/api/protocols/pdt-standard/versions/1')
      .send({ definition: shippedDefinition('pdt-standard.v1.json') });
    expect(shipped.status).toBe(409);
  });

  it('an approval given before a draft was edited does not count for the edited content', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const clinician = await createTestPerson(ctx, ['clinician']);
    const pharmacist = await createTestPerson(ctx, ['pharmacist']);
    const adminAgent = await signedInAgent(ctx, admin);
    const definition = importable();
    await importAs(adminAgent, definition);
    const url = `/api/protocols/${definition.key}/versions/1/approvals`;
    await (await signedInAgent(ctx, clinician)).post(url).send(approvalBy(clinician));
    await adminAgent
      .put(`/api/protocols/${definition.key}/versions/1`)
      .send({ definition: { ...definition, summary: 'Changed after one approval.' } });
    const second = await (
      await signedInAgent(ctx, pharmacist)
    )
      .post(url)
      .send(approvalBy(pharmacist));
    expect(second.status).toBe(201);
    expect(second.body.version.status).toBe('draft');
    expect(second.body.version.approvals).toHaveLength(1);
  });
});
