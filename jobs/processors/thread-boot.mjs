// Entry of the sweep compute threads. A worker thread does not inherit tsx's loader from
// `tsx jobs/worker.ts` (Node 20 runs --import hooks per thread only for files it can already
// load), so the thread registers tsx itself and then imports the TypeScript entry.
import { workerData } from 'node:worker_threads';
import { register } from 'tsx/esm/api';

register();
await import(workerData.entry);
