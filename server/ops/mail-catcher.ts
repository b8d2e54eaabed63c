import { spawn, type ChildProcess } from 'node:child_process';
import { openSync } from 'node:fs';
import path from 'node:path';
import { dataDir, repoRoot } from './paths';

export interface MailCatcher {
  webUrl: string;
  startedHere: boolean;
  stop(): void;
}

async function answers(url: string): Promise<boolean> {
  try {
    const res = await fetch(url, { signal: AbortSignal.timeout(1000) });
    return res.ok;
  } catch {
    return false;
  }
}

/** The local fake SMTP server with a web inbox (maildev), on loopback only. */
export async function ensureMailCatcher(smtpPort: number, webPort: number): Promise<MailCatcher> {
  const webUrl = `http://127.0.0.1:${webPort}`;
  if (await answers(`${webUrl}/api/healthz`))
    return { webUrl, startedHere: false, stop: () => undefined };
  const log = openSync(path.join(dataDir, 'maildev.log'), 'a');
  const child: ChildProcess = spawn(
    process.execPath,
    [
      path.join(repoRoot, 'node_modules/maildev/dist/bin/maildev.js'),
      '--ip',
      '127.0.0.1',
      '--web-ip',
      '127.0.0.1',
      '-s',
      String(smtpPort),
      '-w',
      String(webPort),
      '--silent',
    ],
    { stdio: ['ignore', log, log], detached: false },
  );
  const until = Date.now() + 15_000;
  while (!(await answers(`${webUrl}/api/healthz`))) {
    if (child.exitCode !== null)
      throw new Error(`The mail catcher stopped at start; see .data/maildev.log`);
    if (Date.now() > until) {
      // Not left running behind a start that failed.
      child.kill('SIGTERM');
      throw new Error('The mail catcher did not answer within 15 s; see .data/maildev.log');
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  return { webUrl, startedHere: true, stop: () => child.kill('SIGTERM') };
}
