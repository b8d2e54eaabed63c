import supertest from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RouteSpec } from '../../server/http/route-table';
import type { Role } from '../../shared/roles';
import { createTestPerson, signedInAgent, startTestApp, type TestContext } from '../support/api';

/**
 * Who may call each API route, written out here independently of the server's role table.
 * The test walks the server's own route table: a route added without a line here fails, and so
 * does a route whose answers (401/403 or through) differ from this list.
 */
const all: Role[] = ['clinician', 'nurse', 'pharmacist', 'auditor', 'admin'];
const expected: Record<string, 'public' | Role[]> = {
  'GET /api/health': 'public',
  'GET /api/unit': 'public',
  'POST /api/auth/login': 'public',
  'POST /api/auth/logout': 'public',
  'GET /api/auth/me': all,
  'POST /api/auth/password': all,
  'POST /api/auth/password-link/check': 'public',
  'POST /api/auth/password-link': 'public',
  'GET /api/people': ['admin'],
  'POST /api/people': ['admin'],
  'PATCH /api/people/:id': ['admin'],
  'POST /api/people/:id/password-link': ['admin'],
  'POST /api/people/:id/sessions/end': ['admin'],
  'GET /api/role-requests': ['admin'],
  'POST /api/role-requests/:id/approval': ['admin'],
  'POST /api/role-requests/:id/rejection': ['admin'],
  'GET /api/protocols': all,
  'GET /api/protocols/:key/versions/:version': all,
  'POST /api/protocols/imports': ['admin'],
  'POST /api/protocols/drafts': ['admin'],
  'PUT /api/protocols/:key/versions/:version': ['admin'],
  'POST /api/protocols/:key/versions/:version/approvals': ['clinician', 'pharmacist'],
  'POST /api/protocols/:key/versions/:version/retirement': ['admin'],
  'POST /api/protocols/:key/versions/:version/discard': ['admin'],
  // The dose plan is for order writers only: a pharmacist with a blind check open must not get it here.
  'POST /api/calculations': ['clinician'],
  'POST /api/light-calculations': all,
  'GET /api/patients': ['clinician', 'nurse', 'pharmacist', 'auditor', 'admin'],
  'POST /api/patients': ['clinician', 'admin'],
  'GET /api/patients/possible-duplicates': ['clinician', 'admin'],
  'GET /api/patients/:id': ['clinician', 'nurse', 'pharmacist', 'auditor', 'admin'],
  'GET /api/patients/:id/measurements': ['clinician', 'nurse', 'pharmacist', 'auditor', 'admin'],
  'GET /api/today': all,
  'GET /api/orders': ['clinician', 'nurse', 'pharmacist', 'auditor'],
  'POST /api/orders': ['clinician'],
  'GET /api/orders/signing-facts': ['clinician'],
  'GET /api/orders/cancellable': ['admin'],
  'GET /api/orders/:id': ['clinician', 'nurse', 'pharmacist', 'auditor'],
  'PUT /api/orders/:id': ['clinician'],
  'POST /api/orders/:id/signature': ['clinician'],
  'POST /api/orders/:id/amendments': ['clinician'],
  'POST /api/orders/:id/cancellation': ['clinician', 'admin'],
  'POST /api/orders/:id/dose-checks': ['pharmacist'],
  'POST /api/orders/:id/preparation': ['pharmacist'],
  'POST /api/orders/:id/attachments': ['clinician'],
  'GET /api/attachments/:id': ['clinician', 'nurse', 'pharmacist', 'auditor'],
  'GET /api/outbox': ['admin'],
  'GET /api/patients/:id/follow-up': ['clinician', 'nurse', 'pharmacist', 'auditor', 'admin'],
  'POST /api/follow-up-visits/:id': ['clinician'],
  'POST /api/follow-up-visits/:id/attachments': ['clinician'],
  'GET /api/follow-up/overdue': ['clinician'],
  'POST /api/complications': ['clinician'],
  'GET /api/complications/review-queue': ['auditor'],
  'POST /api/complications/:id/reviewed': ['auditor'],
  'GET /api/outcomes': ['clinician', 'auditor'],
  'GET /api/exports/outcomes.csv': ['clinician', 'auditor'],
  'GET /api/orders/:id/session': ['clinician', 'nurse', 'pharmacist', 'auditor'],
  'POST /api/orders/:id/session-events': ['nurse'],
  'GET /api/devices': all,
  'POST /api/devices': ['admin'],
  'GET /api/devices/:id': all,
  'PUT /api/devices/:id': ['admin'],
  'POST /api/devices/:id/output-checks': ['nurse', 'admin'],
  'GET /api/lenses': all,
  'POST /api/lenses': ['admin'],
  'POST /api/lenses/:id/retirement': ['admin'],
  'GET /api/orders/:id/discharge': ['clinician', 'nurse', 'pharmacist', 'auditor'],
  'POST /api/orders/:id/discharge-email': ['nurse'],
  'GET /api/deviations': ['auditor'],
  'GET /api/deviations/:id': ['auditor'],
  'POST /api/deviations/:id/closure': ['auditor'],
  'POST /api/deviations/:id/reopening': ['auditor'],
  'GET /api/dose-records': ['auditor'],
  'GET /api/trends': ['auditor'],
  'GET /api/exports/deviations.csv': ['auditor'],
  'GET /api/exports/dose-records.csv': ['auditor'],
  'GET /api/audit-events': ['auditor'],
  'GET /api/audit-chain': ['auditor', 'admin'],
  'GET /api/staff': ['auditor'],
  'GET /api/fhir/status': all,
  'GET /api/fhir/patients': ['clinician', 'admin'],
  'POST /api/patients/:id/fhir-refresh': ['clinician', 'admin'],
  'GET /api/orders/:id/fhir': ['clinician', 'nurse', 'pharmacist', 'auditor'],
  'GET /api/outbox/fhir': ['admin'],
  'GET /api/lists': ['clinician', 'nurse', 'pharmacist', 'auditor', 'admin'],
  'POST /api/lists': ['clinician', 'admin'],
  'GET /api/lists/:id': ['clinician', 'nurse', 'pharmacist', 'auditor', 'admin'],
  'POST /api/lists/:id/bookings': ['clinician', 'admin'],
  'DELETE /api/bookings/:id': ['clinician', 'admin'],
  'GET /api/lists/:id/vial-plan': ['pharmacist', 'auditor'],
  'GET /api/stock': ['pharmacist', 'auditor'],
  'POST /api/stock': ['pharmacist'],
  'GET /api/stock/:id/movements': ['pharmacist', 'auditor'],
  'POST /api/stock/:id/adjustments': ['pharmacist'],
  'GET /api/recall': ['pharmacist', 'auditor'],
  'GET /api/recall.csv': ['pharmacist', 'auditor'],
  'POST /api/recall/notifications': ['pharmacist', 'auditor'],
  'GET /api/reports/drug-use': ['pharmacist', 'auditor'],
};

let ctx: TestContext;
let routes: (RouteSpec & { key: string })[];
const agents = new Map<Role, ReturnType<typeof supertest.agent>>();

beforeAll(async () => {
  ctx = await startTestApp();
  routes = (ctx.app.locals.routeTable as RouteSpec[]).map((r) => ({
    ...r,
    key: `${r.method.toUpperCase()} /api${r.path}`,
  }));
  for (const role of all)
    agents.set(role, await signedInAgent(ctx, await createTestPerson(ctx, [role])));
});
afterAll(async () => {
  await ctx.close();
});

/** A concrete URL for a route pattern; ids that don't exist are fine, only the access check matters. */
function concrete(path: string): string {
  return `/api${path.replace(':id', '999999').replace(':key', 'pdt-standard').replace(':version', '1')}`;
}

async function call(
  agent: ReturnType<typeof supertest.agent> | ReturnType<typeof supertest>,
  route: RouteSpec,
) {
  const url = concrete(route.path);
  const request = route.method === 'get' ? agent.get(url) : agent[route.method](url).send({});
  return (await request).status;
}

describe('the permission matrix', () => {
  it('has an expected line for every route in the server’s route table, and no line for a route that is gone', () => {
    expect(routes.map((r) => r.key).sort()).toEqual(Object.keys(expected).sort());
  });

  it('answers every route as expected for nobody and for each role', async () => {
    const mismatches: string[] = [];
    for (const route of routes) {
      const allowed = expected[route.key];
      if (!allowed) continue;
      // POST /auth/logout and /auth/login are public; logging out here would end the agents' sessions.
      if (route.key === 'POST /api/auth/logout') continue;
      const anonymous = await call(supertest(ctx.app), route);
      if (allowed === 'public') {
        if (anonymous === 401 || anonymous === 403)
          mismatches.push(`${route.key} as nobody: ${anonymous}, expected open`);
        continue;
      }
      if (anonymous !== 401) mismatches.push(`${route.key} as nobody: ${anonymous}, expected 401`);
      for (const role of all) {
        const status = await call(agents.get(role)!, route);
        const through = status !== 401 && status !== 403;
        if (allowed.includes(role) !== through)
          mismatches.push(
            `${route.key} as ${role}: ${status}, expected ${allowed.includes(role) ? 'through' : '403'}`,
          );
        if (!allowed.includes(role) && status !== 403)
          mismatches.push(`${route.key} as ${role}: ${status}, expected exactly 403`);
      }
    }
    expect(mismatches).toEqual([]);
  });
});
