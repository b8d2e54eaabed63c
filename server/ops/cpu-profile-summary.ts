// Where a process's CPU went, from the `.cpuprofile` files Node writes with `--cpu-prof`:
// self time by function and by package (or by the project's folder), optionally only within
// time windows (the bench's measured runs, so start-up and the sessions' set-up do not count).
//   tsx server/ops/cpu-profile-summary.ts DIR|FILE… [--top 30]
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { repoRoot } from './paths';

interface ProfileNode {
  id: number;
  callFrame: { functionName: string; url: string; lineNumber: number };
}

interface CpuProfile {
  nodes: ProfileNode[];
  startTime: number;
  samples: number[];
  timeDeltas: number[];
}

/** A span of V8's clock (µs; on Linux the same monotonic clock as `process.hrtime`). */
export interface ProfileWindow {
  fromUs: number;
  toUs: number;
}

export interface ProfileSummary {
  /** Samples taken while busy (idle left out), at Node's default interval of 1 ms each. */
  busyMs: number;
  byFunction: { name: string; where: string; selfMs: number; pct: number }[];
  byPlace: { where: string; selfMs: number; pct: number }[];
}

/** `node_modules/typeorm`, `server/sessions`, `node:internal`…: the place a function's code is in. */
function placeOf(url: string): string {
  if (!url) return '(native)';
  const file = url.replace(/^file:\/\//, '');
  const modules = file.lastIndexOf('/node_modules/');
  if (modules >= 0) {
    const parts = file.slice(modules + '/node_modules/'.length).split('/');
    return `node_modules/${parts[0]!.startsWith('@') ? `${parts[0]}/${parts[1]}` : parts[0]}`;
  }
  if (file.startsWith('node:')) return file.split('/').slice(0, 2).join('/');
  const relative = path.relative(repoRoot, file.split('?')[0]!);
  return relative.startsWith('..') ? file : relative.split('/').slice(0, 2).join('/');
}

function shortFile(url: string): string {
  const file = url.replace(/^file:\/\//, '').split('?')[0]!;
  const modules = file.lastIndexOf('/node_modules/');
  if (modules >= 0) return file.slice(modules + '/node_modules/'.length);
  return file.startsWith(repoRoot) ? path.relative(repoRoot, file) : file;
}

/** Self time by function and place over the given profiles, within the windows if any are given. */
export function summariseProfiles(
  files: string[],
  windows: ProfileWindow[] = [],
  top = 25,
): ProfileSummary {
  const byFunction = new Map<string, { name: string; where: string; selfUs: number }>();
  const byPlace = new Map<string, number>();
  let busyUs = 0;
  for (const file of files) {
    const profile = JSON.parse(readFileSync(file, 'utf8')) as CpuProfile;
    const nodes = new Map(profile.nodes.map((n) => [n.id, n]));
    // Node's default sampling interval (--cpu-prof-interval), 1 ms.
    const intervalUs = 1000;
    let t = profile.startTime;
    for (let i = 0; i < profile.samples.length; i++) {
      t += profile.timeDeltas[i] ?? 0;
      // Each sample counts once (V8 samples on a wall-clock timer: weighting a sample by the gap
      // to the next would give a process that waited for a core the time it waited).
      const us = intervalUs;
      if (windows.length > 0 && !windows.some((w) => t >= w.fromUs && t < w.toUs)) continue;
      const node = nodes.get(profile.samples[i]!);
      if (!node) continue;
      const { functionName, url, lineNumber } = node.callFrame;
      if (functionName === '(idle)') continue;
      busyUs += us;
      const where = placeOf(url);
      const key = `${functionName}|${url}|${lineNumber}`;
      const entry = byFunction.get(key) ?? {
        name: functionName || '(anonymous)',
        where: url ? `${shortFile(url)}:${lineNumber + 1}` : where,
        selfUs: 0,
      };
      entry.selfUs += us;
      byFunction.set(key, entry);
      byPlace.set(where, (byPlace.get(where) ?? 0) + us);
    }
  }
  const pct = (us: number) => Math.round((us / Math.max(1, busyUs)) * 1000) / 10;
  const ms = (us: number) => Math.round(us / 100) / 10;
  return {
    busyMs: ms(busyUs),
    byFunction: [...byFunction.values()]
      .sort((a, b) => b.selfUs - a.selfUs)
      .slice(0, top)
      .map((f) => ({ name: f.name, where: f.where, selfMs: ms(f.selfUs), pct: pct(f.selfUs) })),
    byPlace: [...byPlace]
      .sort((a, b) => b[1] - a[1])
      .slice(0, top)
      .map(([where, us]) => ({ where, selfMs: ms(us), pct: pct(us) })),
  };
}

export function printSummary(title: string, summary: ProfileSummary, perTapOf?: number) {
  const each = (msTotal: number) => (perTapOf ? `  ${(msTotal / perTapOf).toFixed(3)} ms/tap` : '');
  console.log(`\n${title}: ${summary.busyMs} busy samples of 1 ms${each(summary.busyMs)}`);
  console.log('  self time by place:');
  for (const p of summary.byPlace)
    console.log(`    ${String(p.pct).padStart(5)} %  ${p.where}${each(p.selfMs)}`);
  console.log('  self time by function:');
  for (const f of summary.byFunction)
    console.log(`    ${String(f.pct).padStart(5)} %  ${f.name}  (${f.where})`);
}

/** The `.cpuprofile` files named, or found in the folders named. */
export function profileFiles(paths: string[]): string[] {
  return paths.flatMap((p) =>
    statSync(p).isDirectory()
      ? readdirSync(p)
          .filter((f) => f.endsWith('.cpuprofile'))
          .map((f) => path.join(p, f))
      : [p],
  );
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const args = process.argv.slice(2);
  const topAt = args.indexOf('--top');
  const top = topAt >= 0 ? Number(args.splice(topAt, 2)[1]) : 30;
  const files = profileFiles(args);
  if (files.length === 0) throw new Error('usage: cpu-profile-summary.ts DIR|FILE… [--top N]');
  printSummary(files.join(', '), summariseProfiles(files, [], top));
}
