import { randomUUID } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { shippedProtocolsDir } from '../../server/protocols/load-shipped';
import { ownerConnection } from '../support/database';
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

// Wrong passwords are counted per account and per address; each test that types one comes
// through the trusted loopback proxy with an address of its own, so no other test meets its count.
let ctx: TestContext;
beforeAll(async () => {
  ctx = await startTestApp({ TRUST_PROXY: 'loopback' });
});
afterAll(async () => {
  await ctx.close();
});

const ownAddress = () => `2001:db8::${randomUUID().slice(0, 4)}`;

/** The standard PDT file under a key of the test's own, as a draft to import. */
function importable(version = 1) {
  const shipped = JSON.parse(
    readFileSync(path.join(shippedProtocolsDir, 'pdt-standard.v1.json'), 'utf8'),
  );
  return { ...shipped, key: `pdt-sig-${randomUUID().slice(0, 8)}`, version, approval: null };
}

async function importAs(agent: Agent, definition: object) {
  const res = await agent
    .post('/api/protocols/imports')
    .attach('file', Buffer.from(JSON.stringify(definition)), {
      filename: 'protocol.json',
      contentType: 'application/json',
    });
  expect(res.status).toBe(201);
  return res;
}

const signature = (person: TestPerson) => ({
  password: person.password,
  meaning: 'approved-for-use',
});

async function people() {
  return {
    admin: await createTestPerson(ctx, ['admin']),
    clinician: await createTestPerson(ctx, ['clinician']),
    pharmacist: await createTestPerson(ctx, ['pharmacist']),
  };
}

async function approvalRows(key: string) {
  return ctx.dataSource.query(
    'SELECT a.user_id AS userId, a.meaning FROM protocol_approval a JOIN protocol_version v ON v.id = a.protocol_version_id WHERE v.protocol_key = ? ORDER BY a.id',
    [key],
  );
}

/** Imports a version and has two people sign its approval. */
async function approvedVersion(
  who: Awaited<ReturnType<typeof people>>,
  definition: { key: string; version: number },
) {
  await importAs(await signedInAgent(ctx, who.admin), definition);
  for (const person of [who.clinician, who.pharmacist]) {
    const res = await (
      await signedInAgent(ctx, person)
    )
      .post(`/api/protocols/${definition.key}/versions/${definition.version}/approvals`)
      .send(signature(person));
    expect(res.status).toBe(201);
  }
}

describe('approving a protocol version is an electronic signature', () => {
  it('a wrong, missing or empty password approves nothing, and the refusal is audited', async () => {
    const who = await people();
    const definition = importable();
    await importAs(await signedInAgent(ctx, who.admin), definition);
    const agent = await signedInAgent(ctx, who.clinician);
    const url = `/api/protocols/${definition.key}/versions/1/approvals`;
    const address = ownAddress();

    const wrong = await agent
      .post(url)
      .set('X-Forwarded-For', address)
      .send({ password: 'not-my-password', meaning: 'approved-for-use' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields).toEqual([
      { path: 'password', message: 'password must be your sign-in password' },
    ]);
    const missing = await agent.post(url).send({ meaning: 'approved-for-use' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.fields[0].path).toBe('password');
    const empty = await agent.post(url).send({ password: '', meaning: 'approved-for-use' });
    expect(empty.status).toBe(400);
    const bare = await agent.post(url);
    expect(bare.status).toBe(400);

    expect(await approvalRows(definition.key)).toEqual([]);
    const version = await agent.get(`/api/protocols/${definition.key}/versions/1`);
    expect(version.body.version).toMatchObject({ status: 'draft', approvals: [] });
    const refused = await ctx.dataSource.query(
      "SELECT actor_user_id AS actor FROM audit_event WHERE action = 'protocol.approval-refused' AND JSON_VALUE(details, '$.key') = ?",
      [definition.key],
    );
    expect(refused).toEqual([{ actor: who.clinician.id }]);
  });

  it('a signature without its meaning, or with another meaning, is refused and stores nothing', async () => {
    const who = await people();
    const definition = importable();
    await importAs(await signedInAgent(ctx, who.admin), definition);
    const agent = await signedInAgent(ctx, who.clinician);
    const url = `/api/protocols/${definition.key}/versions/1/approvals`;
    const noMeaning = await agent.post(url).send({ password: who.clinician.password });
    expect(noMeaning.status).toBe(400);
    expect(noMeaning.body.error.fields[0]).toEqual({
      path: 'meaning',
      message: 'The meaning of the signature must be "approved-for-use"',
    });
    const otherMeaning = await agent
      .post(url)
      .send({ password: who.clinician.password, meaning: 'ordered' });
    expect(otherMeaning.status).toBe(400);
    expect(await approvalRows(definition.key)).toEqual([]);
  });

  it('the right password records the approval with its meaning, in the row and in the audit trail', async () => {
    const who = await people();
    const definition = importable();
    await approvedVersion(who, definition);
    expect(await approvalRows(definition.key)).toEqual([
      { userId: who.clinician.id, meaning: 'approved-for-use' },
      { userId: who.pharmacist.id, meaning: 'approved-for-use' },
    ]);
    const version = await (
      await signedInAgent(ctx, who.admin)
    ).get(`/api/protocols/${definition.key}/versions/1`);
    expect(version.body.version.status).toBe('approved');
    expect(
      version.body.version.approvals.map((a: { displayName: string; meaning: string }) => ({
        displayName: a.displayName,
        meaning: a.meaning,
      })),
    ).toEqual([
      { displayName: 'Test clinician', meaning: 'approved-for-use' },
      { displayName: 'Test pharmacist', meaning: 'approved-for-use' },
    ]);
    const audited = await ctx.dataSource.query(
      "SELECT JSON_VALUE(details, '$.meaning') AS meaning FROM audit_event WHERE action IN ('protocol.approval-given', 'protocol.approved') AND JSON_VALUE(details, '$.key') = ?",
      [definition.key],
    );
    expect(audited).toEqual([{ meaning: 'approved-for-use' }, { meaning: 'approved-for-use' }]);
  });

  it('guessing passwords at the approval prompt is throttled like a sign-in: then even the right one waits', async () => {
    const who = await people();
    const definition = importable();
    await importAs(await signedInAgent(ctx, who.admin), definition);
    const agent = await signedInAgent(ctx, who.pharmacist);
    const url = `/api/protocols/${definition.key}/versions/1/approvals`;
    const address = ownAddress();
    for (let attempt = 1; attempt <= ctx.config.LOGIN_FAILURE_LIMIT; attempt++) {
      const res = await agent
        .post(url)
        .set('X-Forwarded-For', address)
        .send({ password: `guess-${attempt}`, meaning: 'approved-for-use' });
      expect(res.status).toBe(400);
    }
    const right = await agent
      .post(url)
      .set('X-Forwarded-For', address)
      .send(signature(who.pharmacist));
    expect(right.status).toBe(429);
    expect(right.body.error.code).toBe('too_many_attempts');
    expect(await approvalRows(definition.key)).toEqual([]);
  });
});

describe('a version superseded by a newer approved version', () => {
  it('is marked superseded (derived from the newer approval), and no longer once the newer one is retired', async () => {
    const who = await people();
    const v1 = importable(1);
    const v2 = { ...v1, version: 2 };
    await approvedVersion(who, v1);
    const reader = await signedInAgent(ctx, who.clinician);
    expect(
      (await reader.get(`/api/protocols/${v1.key}/versions/1`)).body.version.supersededBy,
    ).toBeNull();

    await approvedVersion(who, v2);
    const list = (await reader.get('/api/protocols')).body.protocols.find(
      (p: { key: string }) => p.key === v1.key,
    );
    expect(
      list.versions.map((v: { version: number; status: string; supersededBy: number | null }) => [
        v.version,
        v.status,
        v.supersededBy,
      ]),
    ).toEqual([
      [1, 'approved', 2],
      [2, 'approved', null],
    ]);

    await (
      await signedInAgent(ctx, who.admin)
    )
      .post(`/api/protocols/${v1.key}/versions/2/retirement`)
      .send({ reason: 'Withdrawn after the unit review' });
    expect(
      (await reader.get(`/api/protocols/${v1.key}/versions/1`)).body.version.supersededBy,
    ).toBeNull();
  });

  it('an order on it is refused without a reason of substance, and nothing is stored; with one, the reason is kept', async () => {
    const who = await people();
    const v1 = importable(1);
    await approvedVersion(who, v1);
    await approvedVersion(who, { ...v1, version: 2 });
    const patient = await createTestPatient(ctx);
    const agent = await signedInAgent(ctx, who.clinician);
    const body = (reason?: string | null) =>
      pdtOrder(patient.id, {
        protocol: { key: v1.key, version: 1 },
        supersededVersionReason: reason,
      });

    for (const reason of [undefined, null, 'ok ok ok ok ok', 'n/a']) {
      const res = await agent.post('/api/orders').send(body(reason));
      expect(res.status).toBe(400);
      expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(
        'supersededVersionReason',
      );
    }
    const stored = () =>
      ctx.dataSource.query(
        'SELECT superseded_version_reason AS reason FROM treatment_order WHERE patient_id = ?',
        [patient.id],
      );
    expect(await stored()).toEqual([]);

    const reason = 'Second eye of a course begun on version 1; kept the same for consistency';
    const ok = await agent.post('/api/orders').send(body(reason));
    expect(ok.status).toBe(201);
    expect(ok.body.order.supersededVersionReason).toBe(reason);
    expect(await stored()).toEqual([{ reason }]);

    // The newest version needs no reason, and keeps none.
    const newest = await agent.post('/api/orders').send(
      pdtOrder(patient.id, {
        eye: 'left',
        protocol: { key: v1.key, version: 2 },
        supersededVersionReason: reason,
      }),
    );
    expect(newest.status).toBe(201);
    expect(newest.body.order.supersededVersionReason).toBeNull();
  });

  it('a draft saved before the newer version was approved cannot be signed until the reason is given', async () => {
    const who = await people();
    const v1 = importable(1);
    await approvedVersion(who, v1);
    const patient = await createTestPatient(ctx);
    const agent = await signedInAgent(ctx, who.clinician);
    const draft = await agent.post('/api/orders').send(
      pdtOrder(patient.id, {
        protocol: { key: v1.key, version: 1 },
        supersededVersionReason: null,
      }),
    );
    expect(draft.status).toBe(201);
    await approvedVersion(who, { ...v1, version: 2 });

    const sign = await agent.post(`/api/orders/${draft.body.order.id}/signature`).send({
      password: who.clinician.password,
      meaning: 'ordered',
      version: draft.body.order.version,
    });
    expect(sign.status).toBe(400);
    expect(sign.body.error.fields.map((f: { path: string }) => f.path)).toContain(
      'supersededVersionReason',
    );
    const [row] = await ctx.dataSource.query(
      'SELECT status, signed_at AS signedAt FROM treatment_order WHERE id = ?',
      [draft.body.order.id],
    );
    expect(row).toEqual({ status: 'draft', signedAt: null });
  });
});

describe('discarding a protocol draft', () => {
  it('an admin discards an unapproved draft with a reason: audited, kept on record, never approvable or editable again', async () => {
    const who = await people();
    const definition = importable();
    const adminAgent = await signedInAgent(ctx, who.admin);
    await importAs(adminAgent, definition);
    // One approval given already: still an unapproved draft.
    await (
      await signedInAgent(ctx, who.clinician)
    )
      .post(`/api/protocols/${definition.key}/versions/1/approvals`)
      .send(signature(who.clinician));
    const url = `/api/protocols/${definition.key}/versions/1/discard`;

    const noReason = await adminAgent.post(url).send({});
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields[0].path).toBe('reason');
    const shortReason = await adminAgent.post(url).send({ reason: 'no' });
    expect(shortReason.status).toBe(400);
    const [before] = await ctx.dataSource.query(
      'SELECT status FROM protocol_version WHERE protocol_key = ?',
      [definition.key],
    );
    expect(before.status).toBe('draft');

    const reason = 'Drafted from the wrong version by mistake';
    const discarded = await adminAgent.post(url).send({ reason });
    expect(discarded.status).toBe(200);
    expect(discarded.body.version).toMatchObject({ status: 'discarded', discardReason: reason });

    const approve = await (
      await signedInAgent(ctx, who.pharmacist)
    )
      .post(`/api/protocols/${definition.key}/versions/1/approvals`)
      .send(signature(who.pharmacist));
    expect(approve.status).toBe(409);
    const edit = await adminAgent
      .put(`/api/protocols/${definition.key}/versions/1`)
      .send({ definition });
    expect(edit.status).toBe(409);
    expect(await approvalRows(definition.key)).toHaveLength(1);

    const audited = await ctx.dataSource.query(
      "SELECT actor_user_id AS actor, JSON_VALUE(details, '$.reason') AS reason FROM audit_event WHERE action = 'protocol.draft-discarded' AND JSON_VALUE(details, '$.key') = ?",
      [definition.key],
    );
    expect(audited).toEqual([{ actor: who.admin.id, reason }]);
  });

  it('an approved version is never discarded, and only an admin discards', async () => {
    const who = await people();
    const definition = importable();
    await approvedVersion(who, definition);
    const url = `/api/protocols/${definition.key}/versions/1/discard`;
    const reason = 'Trying to throw away an approved version';
    const refused = await (await signedInAgent(ctx, who.admin)).post(url).send({ reason });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('not_a_draft');
    const shipped = await (
      await signedInAgent(ctx, who.admin)
    )
      .post('/api/protocols/pdt-standard/versions/1/discard')
      .send({ reason });
    expect(shipped.status).toBe(409);

    const draft = importable();
    await importAs(await signedInAgent(ctx, who.admin), draft);
    const byClinician = await (
      await signedInAgent(ctx, who.clinician)
    )
      .post(`/api/protocols/${draft.key}/versions/1/discard`)
      .send({ reason });
    expect(byClinician.status).toBe(403);

    const statuses = await ctx.dataSource.query(
      'SELECT protocol_key AS k, status FROM protocol_version WHERE protocol_key IN (?, ?) ORDER BY id',
      [definition.key, draft.key],
    );
    expect(statuses).toEqual([
      { k: definition.key, status: 'approved' },
      { k: draft.key, status: 'draft' },
    ]);
  });

  it('the database itself refuses to discard an approved version or bring a discarded draft back', async () => {
    const who = await people();
    const approved = importable();
    await approvedVersion(who, approved);
    const draft = importable();
    const adminAgent = await signedInAgent(ctx, who.admin);
    await importAs(adminAgent, draft);
    await adminAgent
      .post(`/api/protocols/${draft.key}/versions/1/discard`)
      .send({ reason: 'Not needed after all' });
    const owner = await ownerConnection(ctx.config);
    try {
      await expect(
        owner.query("UPDATE protocol_version SET status = 'discarded' WHERE protocol_key = ?", [
          approved.key,
        ]),
      ).rejects.toThrow(/never discarded/);
      await expect(
        owner.query("UPDATE protocol_version SET status = 'approved' WHERE protocol_key = ?", [
          draft.key,
        ]),
      ).rejects.toThrow(/stays discarded/);
      await expect(
        owner.query("UPDATE protocol_version SET status = 'draft' WHERE protocol_key = ?", [
          draft.key,
        ]),
      ).rejects.toThrow(/cannot go back to draft/);
    } finally {
      await owner.end();
    }
  });
});
