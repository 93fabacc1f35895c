/**
 * A small mariadb connector pool beside Sequelize, for the hot paths Sequelize is slow at:
 * `batch()` inserts of result rows (STACK.md: ~100k rows/s against ~10k for bulkCreate),
 * streamed reads for ranking and CSV export, and keyset pages. Same database and credentials.
 * Relative imports only: the worker loads this outside Vite.
 */
import mariadb, { type Pool, type PoolConnection } from 'mariadb';
import { config } from '../config';

let pool: Pool | undefined;

export function rawPool(): Pool {
  pool ??= mariadb.createPool({
    host: config.DB_HOST,
    port: config.DB_PORT,
    user: config.DB_USER,
    password: config.DB_PASS,
    database: config.DB_NAME,
    connectionLimit: 4,
    connectTimeout: 5_000,
    acquireTimeout: 30_000,
    // DOUBLE and INT come back as JS numbers; BIGINT (COUNT) as number too.
    bigIntAsNumber: true,
    insertIdAsNumber: true,
    decimalAsNumber: true,
    timezone: 'Z',
    // ~16 MB packets keep a 10k-row batch in a handful of round trips.
    maxAllowedPacket: 16 * 1024 * 1024
  } as mariadb.PoolConfig);
  return pool;
}

/** Runs `fn` on one pooled connection, always released. */
export async function withConnection<T>(fn: (conn: PoolConnection) => Promise<T>): Promise<T> {
  const conn = await rawPool().getConnection();
  try {
    return await fn(conn);
  } finally {
    await conn.release();
  }
}

/** Runs `fn` in a transaction on one connection: committed when it returns, rolled back when it throws. */
export async function inTransaction<T>(fn: (conn: PoolConnection) => Promise<T>): Promise<T> {
  return withConnection(async (conn) => {
    await conn.beginTransaction();
    try {
      const out = await fn(conn);
      await conn.commit();
      return out;
    } catch (e) {
      await conn.rollback().catch(() => {});
      throw e;
    }
  });
}

export async function closeRawPool() {
  if (pool) {
    const p = pool;
    pool = undefined;
    await p.end();
  }
}
