/**
 * The worker process: `tsx jobs/worker.ts`. Any number of these may run on any number of
 * hosts against the same Redis and MariaDB. It never imports route code.
 */
import { Worker, type Job, type Processor } from 'bullmq';
import { config } from '../src/lib/server/config';
import { sequelize } from '../src/lib/server/db/sequelize';
import { JOB_QUEUE, QUEUES, type JobName, type QueueName } from '../src/lib/server/queue';
import { workerConnection } from '../src/lib/server/redis';
import * as system from './processors/system';
import * as sweeps from './processors/sweeps';
import { closeComputeThreads } from '../src/lib/server/sweeps/compute';
import { closeRawPool } from '../src/lib/server/sweeps/pool';
import { sweepWorkerOptions } from '../src/lib/server/sweeps/runner';

/** Every job name has a handler: a missing one is a compile error. */
const HANDLERS: Record<JobName, (job: Job) => Promise<unknown>> = {
  ping: system.ping,
  sweepChunk: (job) => sweeps.sweepChunk(job),
  sweepFinalize: (job) => sweeps.sweepFinalize(job)
};

const CONCURRENCY: Record<QueueName, number> = { system: 4, sweeps: 1 };

function processorFor(queue: QueueName): Processor {
  return async (job) => {
    const handler = HANDLERS[job.name as JobName];
    if (!handler || JOB_QUEUE[job.name as JobName] !== queue) throw new Error(`No handler for job ${job.name} on ${queue}`);
    return handler(job);
  };
}

export function startWorkers(queues: readonly QueueName[] = QUEUES) {
  const connection = workerConnection();
  const workers = queues.map((name) => {
    const w = new Worker(name, processorFor(name), {
      connection,
      prefix: config.QUEUE_PREFIX,
      concurrency: CONCURRENCY[name],
      ...(name === 'sweeps' ? sweepWorkerOptions() : {})
    });
    w.on('error', (e) => console.error(`[worker ${name}] ${e.message}`));
    w.on('failed', (job, e) => console.error(`[worker ${name}] job ${job?.id} (${job?.name}) failed: ${e.message}`));
    return w;
  });
  return {
    workers,
    async close() {
      await Promise.all(workers.map((w) => w.close()));
      connection.disconnect();
    }
  };
}

async function main() {
  await sequelize.authenticate();
  const farm = startWorkers();
  console.log(`worker ${process.pid}: consuming ${QUEUES.join(', ')} (redis ${config.REDIS_HOST}:${config.REDIS_PORT}, db ${config.DB_NAME})`);
  let closing = false;
  const shutdown = async (signal: string) => {
    if (closing) return;
    closing = true;
    console.log(`worker ${process.pid}: ${signal}, finishing current jobs…`);
    try {
      await farm.close();
      await closeComputeThreads();
      await closeRawPool();
      await sequelize.close();
    } finally {
      process.exit(0);
    }
  };
  process.on('SIGINT', () => void shutdown('SIGINT'));
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
}

process.on('unhandledRejection', (e) => console.error('worker: unhandled rejection', e));

if (import.meta.url === `file://${process.argv[1]}`) {
  main().catch((e) => {
    console.error(`worker: ${e instanceof Error ? e.message : e}`);
    process.exit(1);
  });
}
