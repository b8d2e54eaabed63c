import { randomUUID } from 'node:crypto';
import { readdirSync, rmSync, statSync } from 'node:fs';
import path from 'node:path';
import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createTestPatient,
  createTestPerson,
  pdtOrder,
  signedInAgent,
  startTestApp,
  type TestContext,
  type TestPerson,
} from '../support/api';

type Agent = ReturnType<typeof supertest.agent>;

const uploadDir = `/tmp/luxtempo-test-uploads-reads-${process.pid}`;
let ctx: TestContext;
let first: TestPerson;
let second: TestPerson;
let auditor: TestPerson;
let firstAgent: Agent;
let secondAgent: Agent;
let auditorAgent: Agent;

beforeAll(async () => {
  ctx = await startTestApp({ UPLOAD_DIR: uploadDir });
  first = await createTestPerson(ctx, ['clinician']);
  second = await createTestPerson(ctx, ['clinician']);
  auditor = await createTestPerson(ctx, ['auditor']);
  [firstAgent, secondAgent, auditorAgent] = await Promise.all([
    signedInAgent(ctx, first),
    signedInAgent(ctx, second),
    signedInAgent(ctx, auditor),
  ]);
});
afterAll(async () => {
  await ctx.close();
  rmSync(uploadDir, { recursive: true, force: true });
});

const json = <T>(value: unknown): T => (typeof value === 'string' ? JSON.parse(value) : value) as T;

async function storedOrder(id: number) {
  const [row] = await ctx.dataSource.query(
    'SELECT status, inputs, plan, row_version AS version, signed_by AS signedBy FROM treatment_order WHERE id = ?',
    [id],
  );
  return {
    status: row.status as string,
    version: Number(row.version),
    signedBy: row.signedBy === null ? null : Number(row.signedBy),
    inputs: json<{ lesionGldUm: number }>(row.inputs),
    plan: json<{ spotDiameterUm: number }>(row.plan),
  };
}

const sign = (agent: Agent, person: TestPerson, id: number, version: number) =>
  agent
    .post(`/api/orders/${id}/signature`)
    .send({ password: person.password, meaning: 'ordered', version });
const wait = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

// Spot = GLD + 1000 µm (TAP Study Group, Arch Ophthalmol 1999): GLD 2500 → 3500 µm, GLD 3000 → 4000 µm.
const spotFor = { 2500: 3500, 3000: 4000 } as const;

describe('editing a draft and signing it cannot interleave', () => {
  it('an edit and a signature of one draft raced by two clinicians: one wins, the other gets 409, and a signed order always carries the inputs its plan was frozen from', async () => {
    const winners = new Set<string>();
    // The edit is sent a little later each round, so it lands before, during and after the signature's work.
    for (let round = 0; round < 16; round += 1) {
      const patient = await createTestPatient(ctx);
      const draft = (await firstAgent.post('/api/orders').send(pdtOrder(patient.id))).body.order;
      const changed = pdtOrder(patient.id, { inputs: { ...draft.inputs, lesionGldUm: 3000 } });
      const [signature, edit] = await Promise.all([
        sign(firstAgent, first, draft.id, draft.version),
        wait(round * 25).then(() =>
          secondAgent.put(`/api/orders/${draft.id}`).send({ ...changed, version: draft.version }),
        ),
      ]);
      expect([signature.status, edit.status].sort(), `round ${round}`).toEqual([200, 409]);
      const stored = await storedOrder(draft.id);
      if (signature.status === 200) {
        winners.add('signature');
        expect(['order_signed', 'order_changed']).toContain(edit.body.error.code);
        expect(stored).toMatchObject({
          status: 'signed',
          signedBy: first.id,
          inputs: { lesionGldUm: 2500 },
          plan: { spotDiameterUm: spotFor[2500] },
        });
      } else {
        winners.add('edit');
        expect(signature.body.error.code).toBe('order_changed');
        expect(signature.body.error.message).toMatch(
          /changed after you opened it.*reload the order/i,
        );
        expect(stored).toMatchObject({
          status: 'draft',
          signedBy: null,
          inputs: { lesionGldUm: 3000 },
          plan: { spotDiameterUm: spotFor[3000] },
        });
      }
    }
    // Which side wins depends on timing; every round above held either way.
    expect(winners.size).toBeGreaterThan(0);
  });

  it('a stale edit or a stale signature is refused with 409 and changes nothing; the current version goes through', async () => {
    const patient = await createTestPatient(ctx);
    const draft = (await firstAgent.post('/api/orders').send(pdtOrder(patient.id))).body.order;
    expect(draft.version).toBe(1);
    const edited = await secondAgent.put(`/api/orders/${draft.id}`).send({
      ...pdtOrder(patient.id, { inputs: { ...draft.inputs, lesionGldUm: 3000 } }),
      version: draft.version,
    });
    expect(edited.status).toBe(200);
    expect(edited.body.order.version).toBe(2);

    // The first clinician still has version 1 on screen.
    const staleEdit = await firstAgent
      .put(`/api/orders/${draft.id}`)
      .send({ ...pdtOrder(patient.id, { note: 'my older copy' }), version: 1 });
    expect(staleEdit.status).toBe(409);
    expect(staleEdit.body.error).toMatchObject({ code: 'order_changed' });
    expect(staleEdit.body.error.message).toContain('version 1');
    const staleSignature = await sign(firstAgent, first, draft.id, 1);
    expect(staleSignature.status).toBe(409);
    expect(await storedOrder(draft.id)).toMatchObject({
      status: 'draft',
      version: 2,
      inputs: { lesionGldUm: 3000 },
    });
    expect(
      (
        await ctx.dataSource.query(
          "SELECT COUNT(*) AS n FROM audit_event WHERE action = 'order.signed' AND entity_id = ?",
          [String(draft.id)],
        )
      )[0].n,
    ).toBe('0');

    // Without a version the server cannot tell what was read: refused, naming the field.
    const unversioned = await firstAgent
      .post(`/api/orders/${draft.id}/signature`)
      .send({ password: first.password, meaning: 'ordered' });
    expect(unversioned.status).toBe(400);
    expect(unversioned.body.error.fields.map((f: { path: string }) => f.path)).toEqual(['version']);

    const current = await sign(firstAgent, first, draft.id, 2);
    expect(current.status).toBe(200);
    expect(await storedOrder(draft.id)).toMatchObject({
      status: 'signed',
      version: 3,
      inputs: { lesionGldUm: 3000 },
      plan: { spotDiameterUm: spotFor[3000] },
    });
  });

  it('two amendments of one signed order at once make one revision; a second amendment afterwards is refused with 409', async () => {
    const patient = await createTestPatient(ctx);
    const draft = (await firstAgent.post('/api/orders').send(pdtOrder(patient.id))).body.order;
    const signed = (await sign(firstAgent, first, draft.id, draft.version)).body.order;
    const amendment = (who: string, gld: number) => ({
      ...pdtOrder(patient.id, { inputs: { ...draft.inputs, lesionGldUm: gld } }),
      amendmentReason: `New angiogram read by ${who}.`,
      version: signed.version,
    });
    const [a, b] = await Promise.all([
      firstAgent
        .post(`/api/orders/${signed.id}/amendments`)
        .send(amendment('the first clinician', 3000)),
      secondAgent
        .post(`/api/orders/${signed.id}/amendments`)
        .send(amendment('the second clinician', 2600)),
    ]);
    expect([a.status, b.status].sort()).toEqual([201, 409]);
    expect(['already_amended', 'order_changed']).toContain(
      (a.status === 409 ? a : b).body.error.code,
    );
    const revisions = await ctx.dataSource.query(
      'SELECT id FROM treatment_order WHERE previous_revision_id = ?',
      [signed.id],
    );
    expect(revisions).toHaveLength(1);
    expect(Number(revisions[0].id)).toBe((a.status === 201 ? a : b).body.order.id);

    const again = await firstAgent
      .post(`/api/orders/${signed.id}/amendments`)
      .send(amendment('the first clinician, again', 2700));
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('already_amended');
    expect(
      await ctx.dataSource.query('SELECT id FROM treatment_order WHERE previous_revision_id = ?', [
        signed.id,
      ]),
    ).toHaveLength(1);
  });
});

describe('one record number, one patient', () => {
  it('four people adding the same record number at once: one 201, the others 409 naming the record number, one row stored', async () => {
    for (let round = 0; round < 5; round += 1) {
      const recordNumber = `RACE-${randomUUID().slice(0, 6).toUpperCase()}`;
      // Four different people typed the same record number: only the number clashes (the same
      // name and date of birth would be a possible duplicate patient, another refusal).
      const body = (i: number) => ({
        recordNumber,
        givenName: ['Morwenna', 'Tamsin', 'Jory', 'Demelza'][i],
        familyName: `Trevail ${recordNumber}`,
        dateOfBirth: '1949-11-30',
        emailConsent: false,
      });
      const answers = await Promise.all(
        [firstAgent, secondAgent, firstAgent, secondAgent].map((agent, i) =>
          agent.post('/api/patients').send(body(i)),
        ),
      );
      expect(answers.map((r) => r.status).sort(), `round ${round}`).toEqual([201, 409, 409, 409]);
      for (const refused of answers.filter((r) => r.status === 409)) {
        expect(refused.body.error.code).toBe('record_number_taken');
        expect(refused.body.error.message).toContain(recordNumber);
      }
      expect(
        await ctx.dataSource.query('SELECT id FROM patient WHERE record_number = ?', [
          recordNumber,
        ]),
      ).toHaveLength(1);
    }
  });
});

const pdf = Buffer.concat([
  Buffer.from('%PDF-1.7\n'),
  Buffer.alloc(1500, 0x20),
  Buffer.from('\n%%EOF\n'),
]);
// The PNG signature and an IHDR start: enough for the check by content.
const png = Buffer.concat([
  Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
  Buffer.alloc(500),
]);

function download(agent: Agent | ReturnType<typeof supertest>, id: number) {
  return agent
    .get(`/api/attachments/${id}`)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
}

async function draftWithAttachment(content: Buffer, filename: string) {
  const patient = await createTestPatient(ctx);
  const draft = (await firstAgent.post('/api/orders').send(pdtOrder(patient.id))).body.order;
  const res = await firstAgent
    .post(`/api/orders/${draft.id}/attachments`)
    .attach('file', content, { filename, contentType: 'text/html' });
  return { draft, patient, res };
}

describe('attachments are read only by roles that may read orders, and never as a web page', () => {
  it('a PDF named .html downloads as application/pdf, as an attachment named .pdf, with nosniff; the file on disk is 0600', async () => {
    const { res } = await draftWithAttachment(pdf, 'results.html');
    expect(res.status).toBe(201);
    const got = await download(firstAgent, res.body.attachment.id);
    expect(got.status).toBe(200);
    expect(got.headers['content-type']).toBe('application/pdf');
    expect(got.headers['content-type']).not.toMatch(/html/);
    expect(got.headers['x-content-type-options']).toBe('nosniff');
    expect(got.headers['content-disposition']).toMatch(
      /^attachment; filename="results\.html\.pdf"/,
    );
    expect(got.headers['content-security-policy']).toContain('sandbox');
    expect(Buffer.compare(got.body as Buffer, pdf)).toBe(0);

    const [row] = await ctx.dataSource.query(
      'SELECT storage_name AS storageName FROM attachment WHERE id = ?',
      [res.body.attachment.id],
    );
    expect(row.storageName).toMatch(/\.pdf$/);
    expect(statSync(path.join(uploadDir, row.storageName)).mode & 0o777).toBe(0o600);
    expect(statSync(uploadDir).mode & 0o777).toBe(0o700);
  });

  it('a PNG named .svg downloads as image/png named .png; HTML named .pdf is refused and nothing is stored', async () => {
    const { res } = await draftWithAttachment(png, 'scan.svg');
    expect(res.status).toBe(201);
    const got = await download(firstAgent, res.body.attachment.id);
    expect(got.headers['content-type']).toBe('image/png');
    expect(got.headers['content-disposition']).toMatch(/^attachment; filename="scan\.svg\.png"/);

    const filesBefore = readdirSync(uploadDir).length;
    const html = Buffer.from('<!doctype html><script>fetch("/api/patients")</script>%PDF-1.7');
    const { draft, res: refused } = await draftWithAttachment(html, 'report.pdf');
    expect(refused.status).toBe(415);
    expect(
      await ctx.dataSource.query('SELECT id FROM attachment WHERE order_id = ?', [draft.id]),
    ).toHaveLength(0);
    expect(readdirSync(uploadDir).length).toBe(filesBefore);
  });

  it('an administrator (who may not read orders) gets 403, nobody gets 401, and neither read is recorded as one', async () => {
    const admin = await createTestPerson(ctx, ['admin']);
    const adminAgent = await signedInAgent(ctx, admin);
    const { res } = await draftWithAttachment(pdf, 'angiogram.pdf');
    const id = res.body.attachment.id;
    const refused = await download(adminAgent, id);
    expect(refused.status).toBe(403);
    expect((refused.body as Buffer).includes(Buffer.from('%PDF'))).toBe(false);
    expect((await download(supertest(ctx.app), id)).status).toBe(401);
    expect(
      await ctx.dataSource.query(
        "SELECT id FROM audit_event WHERE action = 'attachment.viewed' AND actor_user_id = ?",
        [admin.id],
      ),
    ).toHaveLength(0);
    for (const role of ['nurse', 'pharmacist', 'auditor'] as const) {
      const reader = await signedInAgent(ctx, await createTestPerson(ctx, [role]));
      expect((await download(reader, id)).status, role).toBe(200);
    }
  });
});

describe('reading health data is audited', () => {
  it('opening a patient, an order and a report, and every export, is recorded with who and when, and listed in the audit trail', async () => {
    const reader = await createTestPerson(ctx, ['clinician']);
    const readerAgent = await signedInAgent(ctx, reader);
    const { draft, patient, res } = await draftWithAttachment(pdf, 'oct-report.pdf');
    const before = Date.now() - 1000;

    expect((await readerAgent.get(`/api/patients/${patient.id}`)).status).toBe(200);
    // Opened three times within the minute (a screen refreshing): one row.
    for (let i = 0; i < 3; i += 1)
      expect((await readerAgent.get(`/api/orders/${draft.id}`)).status).toBe(200);
    expect((await download(readerAgent, res.body.attachment.id)).status).toBe(200);
    // Exports are never batched: each is a copy leaving the system.
    expect((await auditorAgent.get('/api/exports/deviations.csv')).status).toBe(200);
    expect((await auditorAgent.get('/api/exports/deviations.csv')).status).toBe(200);
    expect((await auditorAgent.get('/api/exports/dose-records.csv')).status).toBe(200);

    const rows = await ctx.dataSource.query(
      "SELECT actor_user_id AS actor, action, entity_type AS entityType, entity_id AS entityId, occurred_at AS at FROM audit_event WHERE action IN ('patient.viewed', 'order.viewed', 'attachment.viewed', 'export.downloaded') AND actor_user_id IN (?, ?) ORDER BY id",
      [reader.id, auditor.id],
    );
    const mine = rows.filter((r: { actor: number }) => Number(r.actor) === reader.id);
    expect(
      mine.map((r: { action: string; entityType: string; entityId: string }) => [
        r.action,
        r.entityType,
        r.entityId,
      ]),
    ).toEqual([
      ['patient.viewed', 'patient', String(patient.id)],
      ['order.viewed', 'order', String(draft.id)],
      ['attachment.viewed', 'order', String(draft.id)],
    ]);
    for (const row of mine) expect(new Date(row.at).getTime()).toBeGreaterThanOrEqual(before);
    const exports = rows.filter(
      (r: { actor: number; action: string }) =>
        Number(r.actor) === auditor.id && r.action === 'export.downloaded',
    );
    expect(exports.map((r: { entityId: string }) => r.entityId)).toEqual(
      expect.arrayContaining(['deviations', 'deviations', 'dose-records']),
    );
    expect(exports.length).toBeGreaterThanOrEqual(3);

    // The auditor sees them in the audit trail, by person.
    const trail = await auditorAgent.get('/api/audit-events').query({ actor: reader.id });
    expect(trail.status).toBe(200);
    expect(trail.body.events.map((e: { action: string }) => e.action)).toEqual(
      expect.arrayContaining(['patient.viewed', 'order.viewed', 'attachment.viewed']),
    );
  });
});
