/**
 * The SMTP fake (maildev) on free ports, in a child process, for tests that read the mail the app
 * sends. Mails are read back through maildev's REST API (GET /email). Each test file starts its own.
 */
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { freePort, onFreshPorts } from './server';

export interface FakeMail {
  to: string[];
  subject: string;
  text: string;
  html: string;
}

export interface MailFake {
  /** Pass as SMTP_URL to startServer({ env }). */
  smtpUrl: string;
  all: () => Promise<FakeMail[]>;
  /** Waits (up to `timeoutMs`) for a mail to `to` whose subject matches, and returns the newest such mail. */
  waitFor: (to: string, subject?: RegExp, timeoutMs?: number) => Promise<FakeMail>;
  stop: () => Promise<void>;
}

function maildevBin(): string {
  const pkgPath = resolve('node_modules/maildev/package.json');
  const pkg = JSON.parse(readFileSync(pkgPath, 'utf8')) as { bin?: string | Record<string, string> };
  const bin = typeof pkg.bin === 'string' ? pkg.bin : pkg.bin?.maildev;
  if (!bin) throw new Error('maildev has no bin entry');
  return join(dirname(pkgPath), bin);
}

interface RawMail {
  to?: { address: string }[];
  subject?: string;
  text?: string;
  html?: string;
}

export const startMailFake = (): Promise<MailFake> => onFreshPorts(launchMailFake);

async function launchMailFake(): Promise<MailFake> {
  const smtp = await freePort();
  const web = await freePort();
  let out = '';
  const proc = spawn(
    process.execPath,
    [maildevBin(), '--smtp', String(smtp), '--web', String(web), '--ip', '127.0.0.1', '--web-ip', '127.0.0.1', '--silent'],
    { stdio: ['ignore', 'pipe', 'pipe'] },
  );
  proc.stdout?.on('data', (d) => (out += d));
  proc.stderr?.on('data', (d) => (out += d));
  const api = `http://127.0.0.1:${web}`;
  const deadline = Date.now() + 15_000;
  for (;;) {
    if (proc.exitCode !== null) throw new Error(`maildev exited (${proc.exitCode}): ${out}`);
    try {
      if ((await fetch(`${api}/email`)).ok) break;
    } catch {
      /* not up yet */
    }
    if (Date.now() > deadline) {
      proc.kill('SIGKILL');
      throw new Error(`maildev did not start: ${out}`);
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  const all = async (): Promise<FakeMail[]> => {
    const list = (await (await fetch(`${api}/email`)).json()) as RawMail[];
    return list.map((e) => ({
      to: (e.to ?? []).map((a) => a.address.toLowerCase()),
      subject: e.subject ?? '',
      text: e.text ?? '',
      html: e.html ?? '',
    }));
  };
  return {
    smtpUrl: `smtp://127.0.0.1:${smtp}`,
    all,
    async waitFor(to, subject, timeoutMs = 10_000) {
      const until = Date.now() + timeoutMs;
      while (Date.now() < until) {
        const hits = (await all()).filter((m) => m.to.includes(to.toLowerCase()) && (!subject || subject.test(m.subject)));
        if (hits.length) return hits[hits.length - 1]!;
        await new Promise((r) => setTimeout(r, 100));
      }
      throw new Error(`no mail to ${to} matching ${subject ?? 'anything'} within ${timeoutMs} ms`);
    },
    stop: () =>
      new Promise<void>((r) => {
        if (proc.exitCode !== null) return r();
        proc.once('exit', () => r());
        proc.kill('SIGTERM');
      }),
  };
}
