/**
 * BullMQ queues (producer side). The web tier only enqueues; workers live in jobs/.
 * The job contract — names, queues and payloads — is one typed map shared with the worker,
 * so a job without a queue or a payload type is a compile error.
 */
import { Queue, type JobsOptions } from 'bullmq';
import type { Redis } from 'ioredis';
import { config } from './config';
import { producerConnection } from './redis';

export const QUEUES = ['system', 'sweeps'] as const;
export type QueueName = (typeof QUEUES)[number];

/** Payload of each job name. */
export interface JobPayloads {
  /** Round trip through a worker, used by health checks and tests. */
  ping: { sentAt: number };
  /** Evaluate and store one chunk of a sweep; `gen` is the sweep's run generation. */
  sweepChunk: { sweepId: number; gen: number; chunk: number };
  /** Rank, summarise and notify once every chunk of a sweep is stored. */
  sweepFinalize: { sweepId: number };
}
export type JobName = keyof JobPayloads;

export const JOB_QUEUE: Record<JobName, QueueName> = {
  ping: 'system',
  sweepChunk: 'sweeps',
  sweepFinalize: 'sweeps'
};

export const DEFAULT_JOB_OPTIONS: JobsOptions = {
  attempts: 3,
  backoff: { type: 'exponential', delay: 1_000 },
  removeOnComplete: { count: 1_000, age: 24 * 3600 },
  removeOnFail: { count: 5_000, age: 7 * 24 * 3600 }
};

let connection: Redis | undefined;
const queues = new Map<QueueName, Queue>();

export function redis(): Redis {
  connection ??= producerConnection();
  return connection;
}

export function queue(name: QueueName): Queue {
  let q = queues.get(name);
  if (!q) {
    q = new Queue(name, { connection: redis(), prefix: config.QUEUE_PREFIX, defaultJobOptions: DEFAULT_JOB_OPTIONS });
    q.on('error', (e) => console.error(`[queue ${name}]`, e.message));
    queues.set(name, q);
  }
  return q;
}

export async function enqueue<N extends JobName>(name: N, data: JobPayloads[N], opts: JobsOptions = {}) {
  return queue(JOB_QUEUE[name]).add(name, data, opts);
}

/** True when Redis answers PING within the timeout. */
export async function pingRedis(timeoutMs = 1_500): Promise<boolean> {
  try {
    const r = redis();
    let timer: NodeJS.Timeout | undefined;
    const answer = await Promise.race([
      // The producer has no offline queue: wait for the connection before sending.
      (r.status === 'ready' ? Promise.resolve() : new Promise<void>((ok) => r.once('ready', ok))).then(() => r.ping()),
      new Promise<never>((_, reject) => (timer = setTimeout(() => reject(new Error('timeout')), timeoutMs)))
    ]).finally(() => clearTimeout(timer));
    return answer === 'PONG';
  } catch {
    return false;
  }
}

export async function closeQueues() {
  await Promise.all([...queues.values()].map((q) => q.close()));
  queues.clear();
  if (connection) {
    connection.disconnect();
    connection = undefined;
  }
}
