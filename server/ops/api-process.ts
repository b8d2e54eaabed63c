import { spawn, type ChildProcess } from 'node:child_process';
import { openSync } from 'node:fs';
import { webServerEnvironment } from './environment';
import { repoRoot } from './paths';

export interface ApiProcess {
  url: string;
  child: ChildProcess;
  /** Ends the process at once, as a crash or a pulled plug would. */
  kill(): Promise<void>;
  /** Asks it to stop (SIGTERM: its workers close and exit, writing a `--cpu-prof` profile). */
  stop(): Promise<void>;
}

/**
 * Starts the server as a process of its own. Node runs it directly with tsx as a loader (not
 * through the tsx command, which would put a second process in between), so killing it really
 * ends the server. Resolves once this very process answers /api/health.
 */
export async function startApiProcess(options: {
  port: number;
  env: NodeJS.ProcessEnv;
  logFile?: string;
  /** How long to wait for its first answer (a machine busy with other work compiles slowly). */
  startTimeoutMs?: number;
  /** Node's own options for the process (and the workers it forks), e.g. `--cpu-prof`. */
  nodeArgs?: string[];
}): Promise<ApiProcess> {
  const log = options.logFile ? openSync(options.logFile, 'a') : 'inherit';
  const child = spawn(
    process.execPath,
    [...(options.nodeArgs ?? []), '--import', 'tsx', 'server/index.ts'],
    {
      cwd: repoRoot,
      // Never the schema owner's password: the web server reads and writes as the app user only.
      env: webServerEnvironment({ ...process.env, ...options.env, PORT: String(options.port) }),
      stdio: ['ignore', log, log],
    },
  );
  const url = `http://127.0.0.1:${options.port}`;
  let exited = false;
  child.once('exit', () => (exited = true));
  // tsx compiles the server on start: a minute, for a machine busy with other work.
  const startTimeoutMs = options.startTimeoutMs ?? 60_000;
  const until = Date.now() + startTimeoutMs;
  for (;;) {
    if (exited)
      throw new Error(
        `the API process on port ${options.port} exited at start; see ${options.logFile ?? 'its output above'}`,
      );
    try {
      // The answer must come from this process, not from one left over on the port.
      const res = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(1000) });
      const ours = [
        res.headers.get('x-luxtempo-pid'),
        res.headers.get('x-luxtempo-parent-pid'),
      ].includes(String(child.pid));
      if (res.ok && ours) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > until) {
      // Not left behind holding the port (and the database) for the next run.
      child.kill('SIGKILL');
      throw new Error(
        `the API process on port ${options.port} did not answer within ${startTimeoutMs / 1000} s; see ${options.logFile ?? 'its output above'}`,
      );
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  const end = (signal: NodeJS.Signals) =>
    new Promise<void>((resolve) => {
      if (exited) return resolve();
      child.once('exit', () => resolve());
      child.kill(signal);
    });
  return { url, child, kill: () => end('SIGKILL'), stop: () => end('SIGTERM') };
}
