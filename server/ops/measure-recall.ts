// npm run measure:recall [-- --url http://127.0.0.1:3000 --lot VOL-L1000 --requests 50]
// Times the recall of one lot (the JSON answer and the CSV) against a running Luxtempo, e.g.
// after `npm run seed:volume -- --records 100000` (about forty orders share each VOL-L… lot).
import { parseArgs } from 'node:util';
import { demoPassword } from '../demo/seed';

const { values } = parseArgs({
  options: {
    url: { type: 'string', default: 'http://127.0.0.1:3000' },
    lot: { type: 'string', default: 'VOL-L1000' },
    requests: { type: 'string', default: '50' },
  },
});
const base = values.url!;
const lot = values.lot!;
const requests = Number(values.requests);

const login = await fetch(`${base}/api/auth/login`, {
  method: 'POST',
  headers: { 'Content-Type': 'application/json', Origin: base },
  body: JSON.stringify({ email: 'pharmacist@demo.luxtempo.example', password: demoPassword }),
});
if (!login.ok) throw new Error(`sign-in as the demo pharmacist failed: ${login.status}`);
const cookie = login.headers
  .getSetCookie()
  .map((c) => c.split(';')[0])
  .join('; ');

async function time(path: string) {
  const times: number[] = [];
  let size = '';
  for (let i = 0; i < requests; i++) {
    const started = performance.now();
    const res = await fetch(`${base}${path}`, { headers: { Cookie: cookie } });
    const text = await res.text();
    times.push(performance.now() - started);
    if (!res.ok) throw new Error(`${path}: ${res.status} ${text.slice(0, 200)}`);
    size = path.includes('.csv')
      ? `${text.trim().split('\r\n').length - 1} rows`
      : `${(JSON.parse(text) as { rows: unknown[] }).rows.length} rows`;
  }
  times.sort((a, b) => a - b);
  const pct = (p: number) =>
    times[Math.min(times.length - 1, Math.ceil((p / 100) * times.length) - 1)]!.toFixed(1);
  console.log(
    `${path}: ${size}; ${requests} sequential requests — p50 ${pct(50)} ms, p95 ${pct(95)} ms, max ${pct(100)} ms`,
  );
}

await time(`/api/recall?lot=${encodeURIComponent(lot)}`);
await time(`/api/recall.csv?lot=${encodeURIComponent(lot)}`);
