/**
 * ioredis connections. Producers (the web tier) fail fast when Redis is down
 * (`enableOfflineQueue: false`, few retries) so a request gets a 503 instead of hanging;
 * workers wait for Redis forever (`maxRetriesPerRequest: null`), as BullMQ requires.
 */
import { Redis, type RedisOptions } from 'ioredis';
import { config } from './config';

const base: RedisOptions = { host: config.REDIS_HOST, port: config.REDIS_PORT, connectTimeout: 2_000 };

export function producerConnection(): Redis {
  return new Redis({
    ...base,
    enableOfflineQueue: false,
    maxRetriesPerRequest: 1,
    retryStrategy: (times) => Math.min(times * 200, 2_000)
  });
}

export function workerConnection(): Redis {
  return new Redis({ ...base, maxRetriesPerRequest: null });
}
