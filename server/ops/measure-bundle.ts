// npm run measure:bundle — the JavaScript a screen needs before it can show, from the built
// client (dist/client): the entry chunk, the screen's route modules, everything those import
// statically, and the service worker, each gzipped as a server would send it. Chunks loaded on
// demand later (other screens, the order form's schemas, mathjs) are not counted.
// Run after a build (`npm run bench` or the e2e tests build it; or `npx vite build`).
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { clientDistDir } from './paths';

interface ManifestChunk {
  file: string;
  isEntry?: boolean;
  imports?: string[];
  dynamicImports?: string[];
}
type Manifest = Record<string, ManifestChunk>;

/** The route modules each measured screen loads before it renders (src/app/router.tsx). */
export const firstLoadRoutes: Record<string, string[]> = {
  'sign-in': ['src/app/routes/sign-in.tsx'],
  today: ['src/app/layout/authenticated-layout.tsx', 'src/app/routes/today.tsx'],
};

export const firstLoadTargetKb = 120;

const kb = (bytes: number) => Math.round(bytes / 102.4) / 10;

export function measureBundle(distDir = clientDistDir) {
  const manifestFile = path.join(distDir, '.vite', 'manifest.json');
  if (!existsSync(manifestFile))
    throw new Error(`${manifestFile} is missing: build the client first (npx vite build)`);
  const manifest = JSON.parse(readFileSync(manifestFile, 'utf8')) as Manifest;
  const gzipped = new Map<string, number>();
  const sizeOf = (file: string) => {
    let size = gzipped.get(file);
    if (size === undefined) {
      size = gzipSync(readFileSync(path.join(distDir, file))).length;
      gzipped.set(file, size);
    }
    return size;
  };
  const entryKey = Object.keys(manifest).find((key) => manifest[key]!.isEntry);
  if (!entryKey) throw new Error('the Vite manifest names no entry chunk');

  /** A chunk and what it imports statically, each file once. */
  const staticClosure = (keys: string[]) => {
    const files = new Set<string>();
    const visit = (key: string) => {
      const chunk = manifest[key];
      if (!chunk) throw new Error(`the Vite manifest has no chunk for ${key}`);
      if (files.has(chunk.file)) return;
      files.add(chunk.file);
      for (const imported of chunk.imports ?? []) visit(imported);
    };
    keys.forEach(visit);
    return files;
  };

  const serviceWorker = existsSync(path.join(distDir, 'sw.js')) ? sizeOf('sw.js') : 0;
  const screens = Object.fromEntries(
    Object.entries(firstLoadRoutes).map(([name, routes]) => {
      const files = [...staticClosure([entryKey, ...routes])];
      const bytes = files.reduce((sum, f) => sum + sizeOf(f), 0) + serviceWorker;
      return [
        name,
        {
          gzipKb: kb(bytes),
          files: files.length + (serviceWorker ? 1 : 0),
          largest: files
            .map((f) => ({ file: f, gzipKb: kb(sizeOf(f)) }))
            .sort((a, b) => b.gzipKb - a.gzipKb)
            .slice(0, 5),
        },
      ];
    }),
  ) as Record<
    string,
    { gzipKb: number; files: number; largest: { file: string; gzipKb: number }[] }
  >;
  const allJs = [...new Set(Object.values(manifest).map((c) => c.file))].filter((f) =>
    f.endsWith('.js'),
  );
  return {
    serviceWorkerGzipKb: kb(serviceWorker),
    screens,
    allJsGzipKb: kb(allJs.reduce((sum, f) => sum + sizeOf(f), 0)),
  };
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename)) {
  const result = measureBundle();
  for (const [name, screen] of Object.entries(result.screens)) {
    console.log(
      `${name.padEnd(8)} ${screen.gzipKb} kB gzip in ${screen.files} files (target ≤ ${firstLoadTargetKb} kB)${screen.gzipKb > firstLoadTargetKb ? ' — MISSED' : ''}`,
    );
    for (const f of screen.largest) console.log(`${''.padEnd(9)}${f.gzipKb} kB  ${f.file}`);
  }
  console.log(
    `service worker ${result.serviceWorkerGzipKb} kB gzip (counted in each); all JS of the app ${result.allJsGzipKb} kB gzip`,
  );
  if (Object.values(result.screens).some((s) => s.gzipKb > firstLoadTargetKb)) process.exitCode = 1;
}
