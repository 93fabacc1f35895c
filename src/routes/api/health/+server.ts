import { json } from '@sveltejs/kit';
import { sequelize } from '$lib/server/db/sequelize';
import { pingRedis } from '$lib/server/queue';
import type { RequestHandler } from './$types';

async function pingDatabase(): Promise<boolean> {
  try {
    await Promise.race([
      sequelize.query('SELECT 1', { plain: true }),
      new Promise<never>((_, reject) => setTimeout(() => reject(new Error('timeout')), 2_000))
    ]);
    return true;
  } catch {
    return false;
  }
}

/** 200 when MariaDB and Redis both answer; 503 naming the one that does not. */
export const GET: RequestHandler = async () => {
  const [db, rd] = await Promise.all([pingDatabase(), pingRedis()]);
  const body = { database: db ? 'ok' : 'unavailable', redis: rd ? 'ok' : 'unavailable' };
  return json(body, { status: db && rd ? 200 : 503, headers: { 'cache-control': 'no-store' } });
};
