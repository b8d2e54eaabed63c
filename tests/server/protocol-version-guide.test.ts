import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { protocolVersionSchema } from '../../shared/protocol/protocol-schema';
import type { Config } from '../../server/config';
import { repoRoot } from '../../server/ops/paths';
import { definitionSha256 } from '../../server/protocols/definition-hash';
import { loadShippedProtocols, shippedProtocolsDir } from '../../server/protocols/load-shipped';
import { freshTestDatabase } from '../support/database';
import { createTestPerson, signedInAgent, startTestApp, type TestContext } from '../support/api';

/*
 * DEVELOPERS.md, "Adding a protocol version", followed as written: the steps are read from the
 * guide, and each action below first checks that its step still says so, so the guide and this
 * test cannot drift apart. The versions go into a database of this test's own, where a newer
 * version of a shipped protocol cannot change what other tests order with.
 */
const guide = readFileSync(path.join(repoRoot, 'DEVELOPERS.md'), 'utf8');
const section = /^### Adding a protocol version\n([\s\S]*?)(?=^#{2,3} )/m.exec(guide)?.[1] ?? '';
/** The guide's numbered steps, each as one line of text. */
const steps = [...section.matchAll(/^(\d+)\. ([\s\S]*?)(?=^\d+\. |^\S|(?![\s\S]))/gm)].map((m) =>
  m[2]!.replace(/\s+/g, ' ').trim(),
);
function step(n: number): string {
  const text = steps[n - 1];
  if (!text) throw new Error(`DEVELOPERS.md, "Adding a protocol version", has no step ${n}`);
  return text;
}

/** Step 1's copy, as the guide writes it: `protocols/<key>.v<N>.json` → `…v<N+1>.json`. */
function copyPattern() {
  const m = /Copy the latest `([^`]+)` to `([^`]+)` and bump `version`/.exec(step(1));
  if (!m) throw new Error(`step 1 no longer says which file to copy where: "${step(1)}"`);
  const fill = (pattern: string, key: string, n: number) =>
    pattern
      .replace('<key>', key)
      .replace('<N+1>', String(n + 1))
      .replace('<N>', String(n));
  return {
    from: (key: string, n: number) => fill(m[1]!, key, n),
    to: (key: string, n: number) => fill(m[2]!, key, n),
    dir: path.dirname(m[1]!),
  };
}

const key = 'cxl-standard';

let config: Config;
let ctx: TestContext;
beforeAll(async () => {
  config = await freshTestDatabase('guide');
  ctx = await startTestApp({ DB_NAME: config.DB_NAME });
});
afterAll(async () => {
  await ctx?.close();
});

/** The highest version of `key` among the files of a protocols directory. */
function latestVersion(dir: string, ofKey: string): number {
  const versions = readdirSync(dir)
    .map((file) => new RegExp(`^${ofKey}\\.v(\\d+)\\.json$`).exec(file)?.[1])
    .filter((v): v is string => v !== undefined)
    .map(Number);
  return Math.max(...versions);
}

/** Step 1 and 2 in a directory laid out like the repository: copy, bump, change a value. */
function copyAndBump(root: string, approval: unknown) {
  const { from, to } = copyPattern();
  const n = latestVersion(path.join(root, copyPattern().dir), key);
  const source = path.join(root, from(key, n));
  expect(existsSync(source), `the guide's file ${from(key, n)}`).toBe(true);
  const definition = JSON.parse(readFileSync(source, 'utf8'));
  expect(definition.version).toBe(n);
  definition.version = n + 1;
  definition.approval = approval;
  // Step 2: a changed value; the summary needs no source of its own.
  expect(step(2)).toMatch(/every value needs its source in `sources`/);
  definition.summary = `${definition.summary} Version ${n + 1}: re-issued with the same figures.`;
  const target = path.join(root, to(key, n));
  writeFileSync(target, `${JSON.stringify(definition, null, 2)}\n`);
  return { n, target, definition };
}

async function importAs(
  agent: ReturnType<typeof supertest.agent>,
  definition: object,
  name: string,
) {
  return agent
    .post('/api/protocols/imports')
    .attach('file', Buffer.from(JSON.stringify(definition)), {
      filename: name,
      contentType: 'application/json',
    });
}

describe('the guide to adding a protocol version (DEVELOPERS.md)', () => {
  it('has its four steps, and the files and commands it names exist', () => {
    expect(steps).toHaveLength(4);
    const { from, dir } = copyPattern();
    expect(path.resolve(repoRoot, dir)).toBe(shippedProtocolsDir);
    const n = latestVersion(shippedProtocolsDir, key);
    expect(existsSync(path.join(repoRoot, from(key, n)))).toBe(true);
    const command = /`(npx vitest run --project (\w+))`/.exec(step(3));
    expect(command, 'step 3 names the engine check').not.toBeNull();
    const viteConfig = readFileSync(path.join(repoRoot, 'vite.config.ts'), 'utf8');
    expect(viteConfig).toContain(`name: '${command![2]}'`);
    const checkFile = /`(tests\/shared\/[\w-]+\.test\.ts)`/.exec(step(3))?.[1];
    expect(checkFile && existsSync(path.join(repoRoot, checkFile))).toBe(true);
  });

  it('a shipped protocol copied and bumped as written passes the engine check and loads, as `npm start` loads it, as the newest approved version with its SHA-256', async () => {
    // A copy of the repository's protocols directory, so the guide's paths apply as written.
    const root = mkdtempSync(path.join(tmpdir(), 'luxtempo-guide-'));
    const protocolsCopy = path.join(root, copyPattern().dir);
    cpSync(shippedProtocolsDir, protocolsCopy, { recursive: true });

    // Step 1: a shipped file names its two approvers and the new date.
    expect(step(1)).toMatch(/a shipped file names its two approvers and the new date/);
    const latest = JSON.parse(
      readFileSync(
        path.join(shippedProtocolsDir, `${key}.v${latestVersion(shippedProtocolsDir, key)}.json`),
        'utf8',
      ),
    );
    const approval = {
      ...latest.approval,
      approvedBy: ['Dr Ines Quillfeather (demo)', 'Dr Wren Halloway (demo)'],
      approvedOn: '2026-12-04',
    };
    const { n, target, definition } = copyAndBump(root, approval);

    // Step 3: the guide's command, on the copy (the engine checks read LUXTEMPO_PROTOCOLS_DIR),
    // limited to the file the step names, which is the one that reads every protocol file.
    const [command = '', ...args] = /`(npx vitest run --project \w+)`/
      .exec(step(3))![1]!
      .split(' ');
    const checkFile = /`(tests\/shared\/[\w-]+\.test\.ts)`/.exec(step(3))![1]!;
    const env = Object.fromEntries(
      Object.entries(process.env).filter(([name]) => !name.startsWith('VITEST')),
    );
    const check = spawnSync(command, [...args, checkFile, '--reporter=verbose'], {
      cwd: repoRoot,
      encoding: 'utf8',
      env: { ...env, NODE_ENV: 'test', LUXTEMPO_PROTOCOLS_DIR: protocolsCopy },
      timeout: 240_000,
    });
    const output = `${check.stdout}${check.stderr}`;
    expect(check.status, output.slice(-3000)).toBe(0);
    // It really ran on the copy: the new file's own checks are among those that passed (the
    // verbose reporter names each test, and the file checks are named after their file).
    expect(output).toContain(path.basename(target));

    // Step 4: the loader `npm start` runs, on the copied directory.
    expect(step(4)).toMatch(/loads at the next `npm start` as an approved version/);
    const loaded = await loadShippedProtocols(ctx.dataSource, protocolsCopy);
    expect(loaded.added).toContain(`${key} v${n + 1}`);

    const clinician = await createTestPerson(ctx, ['clinician']);
    const agent = await signedInAgent(ctx, clinician);
    const res = await agent.get(`/api/protocols/${key}/versions/${n + 1}`);
    expect(res.status).toBe(200);
    expect(res.body.version).toMatchObject({
      key,
      version: n + 1,
      status: 'approved',
      origin: 'shipped',
      sha256: definitionSha256(protocolVersionSchema.parse(definition)),
    });
    expect(res.body.version.sha256).not.toBe(
      (await agent.get(`/api/protocols/${key}/versions/${n}`)).body.version.sha256,
    );

    // "orders that name no version use the newest approved one"
    expect(step(4)).toMatch(/orders that name no version use the newest approved one/);
    const listed = (await agent.get('/api/protocols')).body.protocols.find(
      (p: { key: string }) => p.key === key,
    );
    expect(listed.versions.at(-1)).toMatchObject({ version: n + 1, status: 'approved' });

    // Loading the same files again, as every later start does, changes nothing.
    expect((await loadShippedProtocols(ctx.dataSource, protocolsCopy)).added).toEqual([]);
  }, 300_000);

  it("a site's version copied and bumped as written imports as a draft with its SHA-256 and is approved by two different people", async () => {
    // The site's database holds the shipped versions (and any loaded since); the copy starts
    // from the latest stored one, written where the guide's step 1 looks for it.
    await loadShippedProtocols(ctx.dataSource);
    const root = mkdtempSync(path.join(tmpdir(), 'luxtempo-guide-'));
    const protocolsCopy = path.join(root, copyPattern().dir);
    cpSync(shippedProtocolsDir, protocolsCopy, { recursive: true });
    const admin = await signedInAgent(ctx, await createTestPerson(ctx, ['admin']));
    const listed = (await admin.get('/api/protocols')).body.protocols.find(
      (p: { key: string }) => p.key === key,
    );
    const latestStored: number = listed.versions.at(-1).version;
    const latest = await admin.get(`/api/protocols/${key}/versions/${latestStored}`);
    writeFileSync(
      path.join(protocolsCopy, `${key}.v${latestStored}.json`),
      JSON.stringify(latest.body.version.definition),
    );

    // Step 1: a file for a site's own import sets `approval` to null.
    expect(step(1)).toMatch(/a file for a site's own import sets `approval` to `null`/);
    const withOldApproval = JSON.parse(
      readFileSync(path.join(protocolsCopy, `${key}.v${latestStored}.json`), 'utf8'),
    );
    withOldApproval.version = latestStored + 1;
    const refused = await importAs(admin, withOldApproval, `${key}.v${latestStored + 1}.json`);
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields[0].path).toBe('approval');

    const { n, target, definition } = copyAndBump(root, null);
    expect(n).toBe(latestStored);
    const imported = await importAs(admin, definition, path.basename(target));
    expect(imported.status).toBe(201);
    const sha256 = definitionSha256(protocolVersionSchema.parse(definition));
    const url = `/api/protocols/${key}/versions/${n + 1}`;
    const draft = await admin.get(url);
    expect(draft.body.version).toMatchObject({ version: n + 1, status: 'draft', sha256 });

    // Step 4: two different people, each a clinician or a pharmacist.
    expect(step(4)).toMatch(/two different people, each a clinician or a pharmacist/);
    // Each approval is an electronic signature: the approver's password and its meaning.
    expect(step(4)).toMatch(/password/);
    const clinicianPerson = await createTestPerson(ctx, ['clinician']);
    const pharmacistPerson = await createTestPerson(ctx, ['pharmacist']);
    const clinician = await signedInAgent(ctx, clinicianPerson);
    const pharmacist = await signedInAgent(ctx, pharmacistPerson);
    const signature = (person: { password: string }) => ({
      password: person.password,
      meaning: 'approved-for-use',
    });
    const first = await clinician.post(`${url}/approvals`).send(signature(clinicianPerson));
    expect(first.body.version).toMatchObject({ status: 'draft', sha256 });
    expect((await clinician.post(`${url}/approvals`).send(signature(clinicianPerson))).status).toBe(
      409,
    );
    const second = await pharmacist.post(`${url}/approvals`).send(signature(pharmacistPerson));
    expect(second.status).toBe(201);
    expect(second.body.version).toMatchObject({ status: 'approved', sha256 });
  });
});
