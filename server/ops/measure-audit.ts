// npm run measure:audit [-- --url http://127.0.0.1:3000 --requests 200]
// Times the auditor's queue page (several filters, sequential requests) and the full CSV export
// against a running Luxtempo, e.g. after `npm run seed:volume -- --records 100000`.
import { parseArgs } from 'node:util';
import { demoPassword } from '../demo/seed';

const { values } = parseArgs({
  options: {
    url: { type: 'string', default: 'http://127.0.0.1:3000' },
    requests: { type: 'string', default: '200' },
  },
});
const base = values.url!;
const requests = Number(values.requests);

const login = await fetch(`${base}/api/auth/login`, {
  method: 'POST',
  headers: { 'Content-Type': 'application/json' },
  body: JSON.stringify({ email: 'auditor@demo.luxtempo.example', password: demoPassword }),
});
if (!login.ok) throw new Error(`sign-in as the demo auditor failed: ${login.status}`);
const cookie = login.headers
  .getSetCookie()
  .map((c) => c.split(';')[0])
  .join('; ');

const queries = [
  '',
  'status=open',
  'protocol=pdt-standard',
  'type=light-start-window',
  'severity=major',
  'status=open&protocol=cxl-standard',
  'from=2026-06-01&to=2026-09-30',
  'page=40',
];
const times: number[] = [];
let total = 0;
for (let i = 0; i < requests; i++) {
  const q = queries[i % queries.length];
  const started = performance.now();
  const res = await fetch(`${base}/api/deviations?pageSize=25&${q}`, {
    headers: { Cookie: cookie },
  });
  const body = (await res.json()) as { total: number };
  times.push(performance.now() - started);
  if (!res.ok) throw new Error(`queue ${q}: ${res.status}`);
  if (q === '') total = body.total;
}
times.sort((a, b) => a - b);
const pct = (p: number) =>
  times[Math.min(times.length - 1, Math.ceil((p / 100) * times.length) - 1)]!.toFixed(1);
console.log(
  `deviations queue page: ${requests} requests over ${queries.length} filters — p50 ${pct(50)} ms, p95 ${pct(95)} ms, max ${pct(100)} ms (${total} standing deviations)`,
);

for (const [name, path] of [
  ['deviations', '/api/exports/deviations.csv'],
  ['dose records', '/api/exports/dose-records.csv'],
] as const) {
  const started = performance.now();
  const res = await fetch(`${base}${path}`, { headers: { Cookie: cookie } });
  let bytes = 0;
  let lines = 0;
  for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
    bytes += chunk.length;
    for (const b of chunk) if (b === 10) lines++;
  }
  console.log(
    `CSV export of all ${name}: ${lines - 1} rows, ${(bytes / 1048576).toFixed(1)} MB in ${((performance.now() - started) / 1000).toFixed(1)} s`,
  );
}
