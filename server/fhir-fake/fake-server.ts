import type { Server } from 'node:http';
import express, { type Request, type Response } from 'express';

/**
 * A small stand-in for the hospital's FHIR R4 server, on loopback only: it holds Patients, answers
 * Patient searches by identifier and name, reads and versions resources, and takes transaction
 * Bundles (stored whole as well, so a test or a person can see exactly what arrived). It checks
 * the shape of what it is sent, not every rule of FHIR; the tests validate bundles against the
 * official schema themselves.
 */

type Resource = { resourceType: string; id: string; meta?: Record<string, unknown> } & Record<
  string,
  unknown
>;

export interface FakeFhirServer {
  url: string;
  /** Every transaction Bundle received and accepted, oldest first. */
  received: Record<string, unknown>[];
  /** How the server answers: normally, with nonsense (a 200 that is no FHIR), or not at all (503). */
  setMode(mode: 'normal' | 'nonsense' | 'unavailable'): void;
  stop(): Promise<void>;
}

const fhirJson = 'application/fhir+json';

function outcome(res: Response, status: number, text: string) {
  res
    .status(status)
    .type(fhirJson)
    .json({
      resourceType: 'OperationOutcome',
      issue: [
        { severity: 'error', code: status === 404 ? 'not-found' : 'invalid', diagnostics: text },
      ],
    });
}

export function createFakeFhirApp(seed: Resource[]) {
  const store = new Map<string, Map<string, Resource[]>>();
  const received: Record<string, unknown>[] = [];
  let mode: 'normal' | 'nonsense' | 'unavailable' = 'normal';
  let nextId = 1;

  const versions = (type: string) => {
    if (!store.has(type)) store.set(type, new Map());
    return store.get(type)!;
  };
  const current = (type: string, id: string) => versions(type).get(id)?.at(-1);
  const write = (resource: Resource, id?: string): { resource: Resource; created: boolean } => {
    const theId = id ?? resource.id ?? `fake-${nextId++}`;
    const history = versions(resource.resourceType).get(theId) ?? [];
    const stored = {
      ...resource,
      id: theId,
      meta: { versionId: String(history.length + 1), lastUpdated: new Date().toISOString() },
    };
    versions(resource.resourceType).set(theId, [...history, stored]);
    return { resource: stored, created: history.length === 0 };
  };
  for (const r of seed) write(r, r.id);

  const identifierMatches = (r: Resource, query: string) => {
    const [system, value] = query.includes('|') ? query.split('|', 2) : [undefined, query];
    const ids = (r.identifier as { system?: string; value?: string }[] | undefined) ?? [];
    return ids.some(
      (i) => i.value === value && (system === undefined || system === '' || i.system === system),
    );
  };
  const nameMatches = (r: Resource, text: string) => {
    const wanted = text.toLowerCase();
    const names = (r.name as { family?: string; given?: string[] }[] | undefined) ?? [];
    return names.some((n) =>
      [n.family ?? '', ...(n.given ?? [])].some((part) => part.toLowerCase().startsWith(wanted)),
    );
  };
  const search = (type: string, query: Record<string, string>) =>
    [...versions(type).values()]
      .map((h) => h.at(-1)!)
      .filter((r) => (query.identifier ? identifierMatches(r, query.identifier) : true))
      .filter((r) => (query.name ? nameMatches(r, query.name) : true));

  const app = express();
  app.disable('x-powered-by');
  app.use(express.json({ type: ['application/json', fhirJson], limit: '2mb' }));
  app.use((_req, res, next) => {
    if (mode === 'unavailable') return outcome(res, 503, 'The fake FHIR server is set to be down.');
    if (mode === 'nonsense')
      return res.status(200).type('application/json').send('{"hello":"not FHIR"}');
    next();
  });

  app.get('/metadata', (_req, res) => {
    res.type(fhirJson).json({
      resourceType: 'CapabilityStatement',
      status: 'active',
      date: '2026-12-03',
      kind: 'instance',
      fhirVersion: '4.0.1',
      format: ['json'],
      rest: [
        {
          mode: 'server',
          resource: [
            {
              type: 'Patient',
              searchParam: [
                { name: 'identifier', type: 'token' },
                { name: 'name', type: 'string' },
              ],
            },
          ],
          interaction: [{ code: 'transaction' }],
        },
      ],
    });
  });

  app.get('/:type', (req: Request, res) => {
    const type = String(req.params.type);
    const query = Object.fromEntries(
      Object.entries(req.query).filter(([, v]) => typeof v === 'string'),
    ) as Record<string, string>;
    const found = search(type, query);
    res.type(fhirJson).json({
      resourceType: 'Bundle',
      type: 'searchset',
      total: found.length,
      entry: found.map((r) => ({
        fullUrl: `${type}/${r.id}`,
        resource: r,
        search: { mode: 'match' },
      })),
    });
  });
  app.get('/:type/:id', (req, res) => {
    const found = current(String(req.params.type), String(req.params.id));
    if (!found) return outcome(res, 404, `${req.params.type}/${req.params.id} is not here.`);
    res.type(fhirJson).json(found);
  });
  app.get('/:type/:id/_history', (req, res) => {
    const history = versions(String(req.params.type)).get(String(req.params.id)) ?? [];
    res.type(fhirJson).json({
      resourceType: 'Bundle',
      type: 'history',
      total: history.length,
      entry: [...history].reverse().map((r) => ({ resource: r })),
    });
  });

  /** A transaction: every entry is checked before any is applied, so it applies whole or not at all. */
  app.post('/', (req, res) => {
    const bundle = req.body as {
      resourceType?: string;
      type?: string;
      entry?: {
        fullUrl?: string;
        resource?: Resource;
        request?: { method?: string; url?: string; ifNoneExist?: string };
      }[];
    };
    if (
      bundle?.resourceType !== 'Bundle' ||
      bundle.type !== 'transaction' ||
      !Array.isArray(bundle.entry)
    )
      return outcome(res, 400, 'Expected a Bundle of type transaction with entries.');
    for (const [i, e] of bundle.entry.entries()) {
      const method = e.request?.method;
      const url = e.request?.url ?? '';
      const ok =
        (method === 'POST' && e.resource && url === e.resource.resourceType) ||
        (method === 'PUT' && e.resource && url === `${e.resource.resourceType}/${e.resource.id}`) ||
        (method === 'DELETE' && /^[A-Za-z]+\/[A-Za-z0-9\-.]{1,64}$/.test(url));
      if (!ok)
        return outcome(
          res,
          400,
          `Entry ${i}: request ${method} ${url} does not match its resource.`,
        );
    }
    // Placeholders (urn:uuid) become the ids the server gives.
    const names = new Map<string, string>();
    const answers: { status: string; location?: string }[] = [];
    const pending: (() => void)[] = [];
    for (const e of bundle.entry) {
      const { method, url = '', ifNoneExist } = e.request!;
      if (method === 'POST' && e.resource) {
        const existing = ifNoneExist
          ? search(e.resource.resourceType, Object.fromEntries(new URLSearchParams(ifNoneExist)))[0]
          : undefined;
        const id = existing?.id ?? `fake-${nextId++}`;
        if (e.fullUrl) names.set(e.fullUrl, `${e.resource.resourceType}/${id}`);
        if (existing)
          answers.push({
            status: '200 OK',
            location: `${existing.resourceType}/${id}/_history/${existing.meta?.versionId ?? 1}`,
          });
        else {
          const index = answers.push({ status: '201 Created' }) - 1;
          const resource = e.resource;
          pending.push(() => {
            const { resource: stored } = write(resource, id);
            answers[index]!.location = `${stored.resourceType}/${id}/_history/1`;
          });
        }
      } else if (method === 'PUT' && e.resource) {
        const resource = e.resource;
        const index = answers.push({ status: '200 OK' }) - 1;
        pending.push(() => {
          const { resource: stored, created } = write(resource, resource.id);
          answers[index] = {
            status: created ? '201 Created' : '200 OK',
            location: `${stored.resourceType}/${stored.id}/_history/${String(stored.meta?.versionId)}`,
          };
        });
      } else {
        const [type, id] = url.split('/') as [string, string];
        answers.push({ status: '204 No Content' });
        pending.push(() => versions(type).delete(id));
      }
    }
    const resolve = (value: unknown): unknown => {
      if (typeof value === 'string') return names.get(value) ?? value;
      if (Array.isArray(value)) return value.map(resolve);
      if (value && typeof value === 'object')
        return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, resolve(v)]));
      return value;
    };
    for (const e of bundle.entry) if (e.resource) Object.assign(e.resource, resolve(e.resource));
    for (const apply of pending) apply();
    received.push(req.body as Record<string, unknown>);
    res.type(fhirJson).json({
      resourceType: 'Bundle',
      type: 'transaction-response',
      entry: answers.map((response) => ({ response })),
    });
  });

  return { app, received, setMode: (m: typeof mode) => (mode = m) };
}

/** Starts the fake on 127.0.0.1 (port 0: any free port). */
export async function startFakeFhirServer(
  options: { port?: number; patients?: Resource[] } = {},
): Promise<FakeFhirServer> {
  const { app, received, setMode } = createFakeFhirApp(options.patients ?? []);
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(options.port ?? 0, '127.0.0.1', () => resolve(s));
    s.on('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : options.port;
  return {
    url: `http://127.0.0.1:${port}`,
    received,
    setMode,
    stop: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
