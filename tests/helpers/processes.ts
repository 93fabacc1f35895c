/**
 * Child processes for tests: the built web server, workers, the fake SMTP server and the
 * database CLI, each with its own environment. Output goes to .data/log/test-<name>.log.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { createWriteStream, mkdirSync } from 'node:fs';
import { resolve } from 'node:path';

export const ROOT = resolve(import.meta.dirname, '../..');
const TSX = resolve(ROOT, 'node_modules/.bin/tsx');
const LOG_DIR = resolve(ROOT, '.data/log');

export type Env = Record<string, string>;

function logStream(name: string) {
  mkdirSync(LOG_DIR, { recursive: true });
  return createWriteStream(resolve(LOG_DIR, `test-${name}.log`), { flags: 'a' });
}

export function spawnLogged(name: string, cmd: string, args: string[], env: Env): ChildProcess {
  const child = spawn(cmd, args, { cwd: ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  const out = logStream(name);
  child.stdout?.pipe(out);
  child.stderr?.pipe(out);
  return child;
}

/** Runs the database CLI synchronously (migrate | reset | seed | status); throws on failure. */
export function dbCli(command: string, env: Env): string {
  const r = spawnSync(TSX, ['src/lib/server/db/cli.ts', command], {
    cwd: ROOT,
    env: { ...process.env, ...env },
    encoding: 'utf8',
    timeout: 120_000
  });
  if (r.status !== 0) throw new Error(`db ${command} failed (${r.status}): ${r.stderr || r.stdout}`);
  return r.stdout;
}

export async function waitForHttp(url: string, timeoutMs = 30_000): Promise<void> {
  const t0 = Date.now();
  for (;;) {
    try {
      await fetch(url, { signal: AbortSignal.timeout(2_000) });
      return;
    } catch {
      if (Date.now() - t0 > timeoutMs) throw new Error(`${url} did not answer within ${timeoutMs} ms`);
      await new Promise((r) => setTimeout(r, 150));
    }
  }
}

export interface Running {
  child: ChildProcess;
  stop(signal?: NodeJS.Signals): Promise<number | null>;
}

function running(child: ChildProcess): Running {
  const exited = new Promise<number | null>((r) => child.once('exit', (code) => r(code)));
  return {
    child,
    async stop(signal = 'SIGTERM') {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      const t = setTimeout(() => child.kill('SIGKILL'), 10_000);
      const code = await exited;
      clearTimeout(t);
      return code;
    }
  };
}

/** Starts the production build (`node build/index.js`) and waits until it answers. */
export async function startWebServer(port: number, env: Env): Promise<Running & { url: string }> {
  const url = `http://127.0.0.1:${port}`;
  // LOFTWISE_BUILD_DIR (relative to the repo, e.g. .data/build-copy) runs a copy of a build, so a
  // rebuild of build/ by someone else in the same tree does not pull files from under a running suite.
  const entry = process.env.LOFTWISE_BUILD_DIR ? `${process.env.LOFTWISE_BUILD_DIR}/index.js` : 'build/index.js';
  const child = spawnLogged(`web-${port}`, process.execPath, [entry], {
    HOST: '127.0.0.1',
    PORT: String(port),
    ORIGIN: url,
    ...env
  });
  const r = running(child);
  await waitForHttp(`${url}/api/health`);
  return { ...r, url };
}

export function startWorker(name: string, env: Env): Running {
  return running(spawnLogged(`worker-${name}`, TSX, ['jobs/worker.ts'], env));
}

export function startMailboxProcess(env: Env): Running {
  return running(spawnLogged('mailbox', TSX, ['jobs/mailbox.ts'], env));
}

/** Signs in through the real form action and returns the session cookie header value. */
export async function signInCookie(baseUrl: string, email: string, password = 'loftwise-demo'): Promise<string> {
  const res = await fetch(`${baseUrl}/signin`, {
    method: 'POST',
    redirect: 'manual',
    headers: { origin: baseUrl, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ email, password })
  });
  const cookie = res.headers.getSetCookie().find((c) => c.startsWith('lw_session='));
  if (res.status !== 303 || !cookie) throw new Error(`sign-in as ${email} failed: ${res.status}`);
  return cookie.split(';')[0];
}
