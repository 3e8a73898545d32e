import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';

import { repoRoot } from './paths';

export type MailFake = { smtpPort: number; webURL: string; stop(): Promise<void> };

async function answers(url: string) {
  try {
    const res = await fetch(url, { signal: AbortSignal.timeout(1_000) });
    return res.ok;
  } catch {
    return false;
  }
}

/**
 * Starts the local mail fake (maildev) on loopback: SMTP for the server to send to, and
 * a web page + REST API (`/api/email`) where developers and tests read what was sent.
 */
export async function startMailFake(options: {
  smtpPort: number;
  webPort: number;
  mailDir?: string;
}): Promise<MailFake> {
  const webURL = `http://127.0.0.1:${options.webPort}`;
  if (await answers(`${webURL}/api/healthz`)) {
    throw new Error(
      `Port ${options.webPort} already answers as a mail fake: another Cyclemoot run is still up. Stop it first.`,
    );
  }
  const args = [
    '--smtp',
    String(options.smtpPort),
    '--ip',
    '127.0.0.1',
    '--web',
    String(options.webPort),
    '--web-ip',
    '127.0.0.1',
    ...(options.mailDir ? ['--mail-directory', options.mailDir] : []),
  ];
  const bin = path.join(repoRoot, 'node_modules', '.bin', 'maildev');
  const child: ChildProcess = spawn(bin, args, { stdio: ['ignore', 'pipe', 'pipe'] });
  let output = '';
  child.stdout?.on('data', (d) => (output += d));
  child.stderr?.on('data', (d) => (output += d));
  const deadline = Date.now() + 20_000;
  while (!(await answers(`${webURL}/api/healthz`))) {
    if (child.exitCode !== null || Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error(`The mail fake did not start on SMTP ${options.smtpPort} / web ${options.webPort}:\n${output}`);
    }
    await sleep(150);
  }
  return {
    smtpPort: options.smtpPort,
    webURL,
    async stop() {
      if (child.exitCode !== null) return;
      const exited = new Promise((resolve) => child.once('exit', resolve));
      child.kill('SIGTERM');
      await Promise.race([exited, sleep(3_000)]);
      if (child.exitCode === null) child.kill('SIGKILL');
    },
  };
}
