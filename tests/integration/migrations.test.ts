import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import mariadb from 'mariadb';
import { dbCli } from '../helpers/processes';
import { config } from '../../src/lib/server/config';

/** Migrations run against their own scratch database, so other suites' data is untouched. */
const ENV = { LOFTWISE_ENV: 'test', DB_NAME: 'loftwise_scratch' };

describe('migrations on the real MariaDB', () => {
  let conn: mariadb.Connection;
  const tables = async () =>
    (await conn.query('SELECT table_name AS t FROM information_schema.tables WHERE table_schema = ?', ['loftwise_scratch'])).map(
      (r: { t: string }) => r.t
    );

  beforeAll(async () => {
    conn = await mariadb.createConnection({ host: config.DB_HOST, port: config.DB_PORT, user: config.DB_USER, password: config.DB_PASS });
  });
  afterAll(async () => {
    await conn?.end();
  });

  it('apply from empty, roll back to empty, and apply again', async () => {
    dbCli('reset', ENV);
    const up = await tables();
    for (const t of ['users', 'workspaces', 'memberships', 'sessions', 'api_tokens', 'mail_messages', 'schema_migrations']) {
      expect(up, `table ${t} after migrate`).toContain(t);
    }
    const status = dbCli('status', ENV);
    expect(status).not.toContain('pending');

    const applied = status.split('\n').filter((l) => l.startsWith('applied')).length;
    expect(applied).toBeGreaterThan(2);
    // The newest one alone, then all the rest.
    expect(dbCli('rollback', ENV)).toMatch(/rolled back \S+/);
    expect(dbCli('status', ENV).split('\n').filter((l) => l.startsWith('pending'))).toHaveLength(1);
    expect(dbCli('rollback-all', ENV)).toContain(`rolled back ${applied - 1} migration(s)`);
    const down = await tables();
    expect(down.filter((t: string) => t !== 'schema_migrations')).toEqual([]);
    expect(dbCli('status', ENV)).not.toContain('applied');

    dbCli('migrate', ENV);
    expect(dbCli('status', ENV)).not.toContain('pending');
  });

  it('creates utf8mb4 tables and the indexes the queries rely on', async () => {
    const rows = await conn.query(
      "SELECT table_name AS t, table_collation AS c FROM information_schema.tables WHERE table_schema = 'loftwise_scratch'"
    );
    for (const r of rows) expect(r.c, r.t).toMatch(/^utf8mb4/);
    const idx = await conn.query(
      "SELECT index_name AS i FROM information_schema.statistics WHERE table_schema = 'loftwise_scratch' AND table_name = 'memberships'"
    );
    expect(idx.map((r: { i: string }) => r.i)).toContain('memberships_user_workspace');
  });

  it('gives share links their report units, SI unless chosen', async () => {
    const [col] = await conn.query(
      "SELECT column_type AS t, is_nullable AS n, column_default AS d FROM information_schema.columns WHERE table_schema = 'loftwise_scratch' AND table_name = 'share_links' AND column_name = 'units'"
    );
    expect(col).toBeDefined();
    expect(col.t).toBe("enum('si','us')");
    expect(col.n).toBe('NO');
    expect(String(col.d).replace(/'/g, '')).toBe('si');
  });

  it('seeds the demo scenario idempotently', async () => {
    dbCli('seed', ENV);
    dbCli('seed', ENV);
    const [{ n }] = await conn.query('SELECT COUNT(*) AS n FROM loftwise_scratch.users');
    expect(Number(n)).toBe(3);
    const [{ m }] = await conn.query('SELECT COUNT(*) AS m FROM loftwise_scratch.memberships');
    expect(Number(m)).toBe(5);
  });
});
