import type { Job } from 'bullmq';
import type { JobPayloads } from '../../src/lib/server/queue';

/** Health round trip: proves a worker is consuming the queue. */
export async function ping(job: Job<JobPayloads['ping']>) {
  return { sentAt: job.data.sentAt, answeredAt: Date.now(), pid: process.pid };
}
