import 'reflect-metadata';
import { randomUUID } from 'node:crypto';
import type { Express } from 'express';
import supertest from 'supertest';
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/roles';
import { createApp } from '../../server/app';
import { hashPassword } from '../../server/auth/passwords';
import { loadConfig, type Config } from '../../server/config';
import { appDataSource } from '../../server/db/options';
import type { Mailer, OutgoingMessage } from '../../server/mail/mailer';
import { createUserRepository } from '../../server/people/repository';

export interface TestContext {
  app: Express;
  config: Config;
  dataSource: DataSource;
  sentMail: OutgoingMessage[];
  close(): Promise<void>;
}

export function testConfig(overrides: Record<string, string> = {}): Config {
  return loadConfig({ ...process.env, ...overrides });
}

/** A fresh app on the test database, connected as the app's own (restricted) database user. */
export async function startTestApp(
  overrides: Record<string, string> = {},
  options: { now?: () => number } = {},
): Promise<TestContext> {
  const config = testConfig(overrides);
  const dataSource = appDataSource(config);
  await dataSource.initialize();
  const sentMail: OutgoingMessage[] = [];
  const mailer: Mailer = { send: async (m) => void sentMail.push(m), close: () => undefined };
  const app = createApp({
    config,
    dataSource,
    mailer,
    ...(options.now ? { clock: { now: () => new Date(options.now!()) } } : {}),
  });
  return { app, config, dataSource, sentMail, close: () => dataSource.destroy() };
}

export interface TestPerson {
  id: number;
  email: string;
  password: string;
  roles: Role[];
}

/** Each test makes its own people, with unique e-mails, so tests never depend on each other. */
export async function createTestPerson(
  ctx: TestContext,
  roles: Role[],
  options: { active?: boolean } = {},
): Promise<TestPerson> {
  const email = `${roles.join('-')}-${randomUUID().slice(0, 8)}@test.luxtempo.example`;
  const password = `pw-${randomUUID()}`;
  const users = createUserRepository(ctx.dataSource);
  // Cost 4 keeps hundreds of test people quick to make; the format is the one the app writes.
  const user = await users.create({
    email,
    displayName: `Test ${roles.join(' & ')}`,
    roles,
    passwordHash: await hashPassword(password, 4),
  });
  await users.setPassword(user.id, user.passwordHash);
  if (options.active === false) await users.update(user.id, { active: false });
  return { id: user.id, email, password, roles };
}

/** A supertest agent that keeps cookies, already signed in as the person. */
export async function signedInAgent(ctx: TestContext, person: TestPerson) {
  const agent = supertest.agent(ctx.app);
  const res = await agent
    .post('/api/auth/login')
    .send({ email: person.email, password: person.password });
  if (res.status !== 200)
    throw new Error(`sign-in for the test failed: ${res.status} ${JSON.stringify(res.body)}`);
  return agent;
}

/** A fictitious patient with a record number of the test's own. */
export async function createTestPatient(
  ctx: TestContext,
  overrides: Partial<{ email: string | null; emailConsent: boolean }> = {},
) {
  const recordNumber = `T-${randomUUID().slice(0, 8).toUpperCase()}`;
  const rows = await ctx.dataSource.query(
    'INSERT INTO patient (record_number, given_name, family_name, date_of_birth, email, email_consent) VALUES (?, ?, ?, ?, ?, ?) RETURNING id',
    [
      recordNumber,
      'Testa',
      `Patient-${recordNumber}`,
      '1956-04-12',
      overrides.email ?? null,
      overrides.emailConsent ?? false,
    ],
  );
  return { id: Number(rows[0].id), recordNumber };
}

const pdtChecklist = [
  'porphyria',
  'hypersensitivity',
  'hepatic-impairment',
  'pregnancy-breastfeeding',
  'other-photosensitisers',
];
const cxlChecklist = ['thin-stroma', 'active-infection', 'herpetic-keratitis'];

/**
 * Version 1 of each shipped protocol is superseded by version 2; orders on it need a reason of
 * substance. The tests' expected figures were worked out on version 1, so they keep it.
 */
export const supersededVersionReason =
  'Test orders keep version 1, on which their expected figures were worked out';

/** The bedside's identity and eye said again, which a light or UV start needs before it (`stepId`: that step). */
export function identityConfirmed(stepId: string) {
  return {
    type: 'identity-confirmed',
    stepId,
    checks: { patientName: true, dateOfBirth: true, treatmentEye: true },
  };
}

/** A complete, signable order body for the standard PDT protocol (170 cm, 70 kg, GLD 2500 µm). */
export function pdtOrder(patientId: number, overrides: Record<string, unknown> = {}) {
  return {
    patientId,
    eye: 'right',
    protocol: { key: 'pdt-standard', version: 1 },
    inputs: {
      height: { value: 170, unit: 'cm' },
      weight: { value: 70, unit: 'kg' },
      bsaFormula: 'mosteller',
      lesionGldUm: 2500,
      lensMagnification: 1,
    },
    checklist: pdtChecklist.map((id) => ({ id, answer: 'no' })),
    supersededVersionReason,
    ...overrides,
  };
}

export function cxlOrder(patientId: number, overrides: Record<string, unknown> = {}) {
  return {
    patientId,
    eye: 'left',
    protocol: { key: 'cxl-standard', version: 1 },
    inputs: { stromalThicknessUm: 460 },
    checklist: cxlChecklist.map((id) => ({ id, answer: 'no' })),
    supersededVersionReason,
    ...overrides,
  };
}

type Agent = ReturnType<typeof supertest.agent>;

/** Signs a draft as the clinician; returns the signed order. */
export async function signOrder(agent: Agent, person: TestPerson, body: object) {
  const draft = await agent.post('/api/orders').send(body);
  if (draft.status !== 201) throw new Error(`draft failed: ${JSON.stringify(draft.body)}`);
  const signed = await agent
    .post(`/api/orders/${draft.body.order.id}/signature`)
    .send({ password: person.password, meaning: 'ordered', version: draft.body.order.version });
  if (signed.status !== 200) throw new Error(`signing failed: ${JSON.stringify(signed.body)}`);
  return signed.body.order;
}

/**
 * A standard PDT order taken through the blind check and preparation, ready for the session.
 * `reconstitutedMinutesAgo` lets a test place the beyond-use time.
 */
export async function preparedPdtOrder(
  ctx: TestContext,
  team: { clinician: [Agent, TestPerson]; pharmacist: Agent },
  reconstitutedMinutesAgo = 30,
  patientOverrides: Parameters<typeof createTestPatient>[1] = {},
) {
  const patient = await createTestPatient(ctx, patientOverrides);
  const order = await signOrder(team.clinician[0], team.clinician[1], pdtOrder(patient.id));
  const check = await team.pharmacist
    .post(`/api/orders/${order.id}/dose-checks`)
    .send({ bsaM2: 1.82, doseMg: 10.92, drugVolumeMl: 5.46 });
  if (check.status !== 201) throw new Error(`check failed: ${JSON.stringify(check.body)}`);
  const prepared = await team.pharmacist.post(`/api/orders/${order.id}/preparation`).send({
    vialLot: 'TEST-LOT-1',
    vialExpiry: new Date(Date.now() + 90 * 86_400_000).toISOString().slice(0, 10),
    reconstitutedAt: new Date(Date.now() - reconstitutedMinutesAgo * 60_000).toISOString(),
    volumeDrawnMl: 5.5,
  });
  if (prepared.status !== 201)
    throw new Error(`preparation failed: ${JSON.stringify(prepared.body)}`);
  return prepared.body.order;
}
