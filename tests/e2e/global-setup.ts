/**
 * Browser suite set-up: services up, the e2e database reset and seeded, then the production
 * build on 127.0.0.1:3100 with one worker and the fake SMTP server, all on their own
 * database (loftwise_e2e) and queue prefix so the integration suite can run beside it.
 */
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { dbCli, ROOT, startMailboxProcess, startWebServer, startWorker, type Running } from '../helpers/processes';
import { E2E_ENV, E2E_PORT } from './env';

export default async function setup() {
  const build = process.env.LOFTWISE_BUILD_DIR ?? 'build';
  if (!existsSync(resolve(ROOT, build, 'index.js'))) throw new Error(`${build}/ is missing: run \`npx vite build\` (npm test does)`);
  if (!existsSync('/usr/bin/chromium')) throw new Error('/usr/bin/chromium is missing: apt-get install -y chromium (npm test does)');
  execFileSync('bash', ['docker/services.sh', 'start'], { cwd: ROOT, stdio: 'inherit' });
  dbCli('reset', E2E_ENV);
  dbCli('seed', E2E_ENV);
  const procs: Running[] = [];
  procs.push(startMailboxProcess(E2E_ENV));
  procs.push(startWorker('e2e', E2E_ENV));
  procs.push(await startWebServer(E2E_PORT, E2E_ENV));
  return async () => {
    await Promise.all(procs.map((p) => p.stop()));
  };
}
