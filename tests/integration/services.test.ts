import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { ROOT, startWebServer } from '../helpers/processes';

/**
 * docker/services.sh on its own data folder and ports, so the suite's shared services are
 * never touched: start is idempotent, survives a kill -9, names a taken port, and the
 * health route reports Redis when it is stopped.
 */
const dataDir = mkdtempSync(join(tmpdir(), 'lw-svc-'));
const env = { ...process.env, DATA_DIR: dataDir, DB_PORT: '3317', REDIS_PORT: '6391', DB_NAMES: 'loftwise_test' };
const svc = (...args: string[]) => spawnSync('bash', ['docker/services.sh', ...args], { cwd: ROOT, env, encoding: 'utf8', timeout: 120_000 });
const pid = (name: string) => Number(readFileSync(join(dataDir, 'run', `${name}.pid`), 'utf8').trim());

describe('docker/services.sh', () => {
  afterAll(() => {
    svc('stop');
    rmSync(dataDir, { recursive: true, force: true });
  });

  it('starts both services, and a second start is a no-op that keeps the same processes', () => {
    const first = svc('start');
    expect(first.status, first.stderr).toBe(0);
    expect(first.stdout).toContain('mariadb ready on 127.0.0.1:3317');
    expect(first.stdout).toContain('redis ready on 127.0.0.1:6391');
    const [m, r] = [pid('mariadb'), pid('redis')];
    const second = svc('start');
    expect(second.status, second.stderr).toBe(0);
    expect(second.stdout).toContain(`mariadb already running (pid ${m})`);
    expect(second.stdout).toContain(`redis already running (pid ${r})`);
    expect(svc('status').status).toBe(0);
  });

  it('recovers from a server killed with SIGKILL (stale pid file)', () => {
    const old = pid('mariadb');
    process.kill(old, 'SIGKILL');
    process.kill(pid('redis'), 'SIGKILL');
    // Wait for the kernel to reap them.
    for (let i = 0; i < 100 && [old].some((p) => { try { process.kill(p, 0); return true; } catch { return false; } }); i++) {
      execFileSync('sleep', ['0.1']);
    }
    expect(svc('status').status).toBe(1);
    const again = svc('start');
    expect(again.status, again.stderr).toBe(0);
    expect(pid('mariadb')).not.toBe(old);
    expect(svc('status').stdout).toContain('mariadb up');
  });

  it('names the port when another program holds it', () => {
    const other = spawnSync('bash', ['docker/services.sh', 'start', 'redis'], {
      cwd: ROOT,
      env: { ...env, DATA_DIR: join(dataDir, 'other') },
      encoding: 'utf8'
    });
    expect(other.status).toBe(1);
    expect(other.stderr).toContain('port 6391 (REDIS_PORT) is taken');
  });

  it('health is 200 with both services up and 503 naming Redis once Redis is stopped', async () => {
    const web = await startWebServer(3112, { LOFTWISE_ENV: 'test', REDIS_PORT: '6391', DB_PORT: '3317' });
    try {
      const up = await fetch(`${web.url}/api/health`);
      expect(up.status).toBe(200);
      expect(await up.json()).toEqual({ database: 'ok', redis: 'ok' });
      expect(svc('stop', 'redis').status).toBe(0);
      const down = await fetch(`${web.url}/api/health`);
      expect(down.status).toBe(503);
      expect(await down.json()).toEqual({ database: 'ok', redis: 'unavailable' });
      expect(svc('stop', 'mariadb').status).toBe(0);
      const both = await fetch(`${web.url}/api/health`);
      expect(both.status).toBe(503);
      expect(await both.json()).toEqual({ database: 'unavailable', redis: 'unavailable' });
    } finally {
      await web.stop();
    }
  });
});
