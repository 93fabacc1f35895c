/**
 * The write side of sweep results, on the raw mariadb pool. Relative imports only (worker).
 *
 * Counted once: a chunk is committed in ONE transaction that (1) inserts its ledger row
 * (sweep_chunks, primary key (sweep_id, chunk_index)) with INSERT IGNORE — zero affected rows
 * means another attempt or another worker already committed it, and we roll back; (2) writes
 * its case rows with batch() INSERT IGNORE; (3) locks the sweep row, checks it still accepts
 * results (queued/running), adds the chunk's counts to the counters and (4) claims completion
 * when chunks_done reached chunk_count — an UPDATE guarded by `finalize_claimed_at IS NULL`,
 * so exactly one transaction ever sees affectedRows = 1. A worker killed anywhere before
 * COMMIT leaves nothing behind; the retry redoes the whole chunk.
 */
import { hostname } from 'node:os';
import type { PoolConnection } from 'mariadb';
import { PARAM_COLUMNS, PARAM_SLOTS, RESULT_COLUMNS } from './columns';
import { VALUE_WIDTH, type ChunkResult } from './chunk-result';
import { inTransaction, withConnection } from './pool';

export const WORKER_ID = `${hostname()}:${process.pid}`;

const CASE_COLUMNS = [
  'sweep_id',
  'case_index',
  'chunk_index',
  'feasible',
  'failed',
  'fail_mask',
  'reasons',
  'chunk_front',
  ...RESULT_COLUMNS.map((r) => r.column),
  ...PARAM_COLUMNS,
  'detail'
];
export const INSERT_CASES_SQL = `INSERT IGNORE INTO sweep_cases (${CASE_COLUMNS.join(', ')}) VALUES (${CASE_COLUMNS.map(() => '?').join(', ')})`;

const num = (x: number) => (Number.isFinite(x) ? x : null);

export const INSERT_MARKS_SQL = 'INSERT IGNORE INTO sweep_front_marks (sweep_id, case_index, o1, o2, o3, o4) VALUES (?, ?, ?, ?, ?, ?)';

/** The chunk's own front (chunkFront = 1) with its objective values, for the live front. */
export function frontMarkRows(sweepId: number, r: ChunkResult): unknown[][] {
  const rows: unknown[][] = [];
  if (r.objectiveSlots.length < 2) return rows;
  for (let i = 0; i < r.count; i++) {
    if (!r.chunkFront[i]) continue;
    const o = [0, 1, 2, 3].map((j) => (j < r.objectiveSlots.length ? num(r.values[i * VALUE_WIDTH + r.objectiveSlots[j]]) : null));
    rows.push([sweepId, r.start + i, ...o]);
  }
  return rows;
}

/** The rows of a chunk as batch() parameter arrays. */
export function caseRows(sweepId: number, r: ChunkResult): unknown[][] {
  const rows: unknown[][] = new Array(r.count);
  for (let i = 0; i < r.count; i++) {
    const row: unknown[] = [
      sweepId,
      r.start + i,
      r.chunkIndex,
      r.feasible[i],
      r.failed[i],
      r.failMask[i],
      r.reasons[i],
      r.chunkFront[i]
    ];
    for (let k = 0; k < VALUE_WIDTH; k++) row.push(num(r.values[i * VALUE_WIDTH + k]));
    for (let k = 0; k < PARAM_SLOTS; k++) row.push(num(r.params[i * PARAM_SLOTS + k]));
    row.push(r.detail[i]);
    rows[i] = row;
  }
  return rows;
}

/** batch() in slices, so one call never builds an oversized packet. */
export async function batchInsert(conn: PoolConnection, sql: string, rows: unknown[][], slice = 5_000): Promise<number> {
  let affected = 0;
  for (let k = 0; k < rows.length; k += slice) {
    const res = await conn.batch(sql, rows.slice(k, k + slice));
    const list = Array.isArray(res) ? res : [res];
    for (const x of list) affected += Number(x.affectedRows);
  }
  return affected;
}

export type CommitOutcome =
  | { kind: 'committed'; claimedCompletion: boolean; writeMs: number }
  | { kind: 'duplicate' }
  | { kind: 'refused'; status: string };

/** Commits one evaluated chunk (see the file comment). */
export async function commitChunk(sweepId: number, r: ChunkResult, attempts: number): Promise<CommitOutcome> {
  const t0 = performance.now();
  return inTransaction(async (conn) => {
    const ledger = await conn.query(
      `INSERT IGNORE INTO sweep_chunks
         (sweep_id, chunk_index, first_case, case_count, feasible_cases, failed_cases, attempts, worker, eval_ms, write_ms, created_at)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, 0, UTC_TIMESTAMP(3))`,
      [sweepId, r.chunkIndex, r.start, r.count, r.feasibleCount, r.failedCount, attempts, WORKER_ID, Math.round(r.evalMs)]
    );
    if (Number(ledger.affectedRows) === 0) {
      // Already committed (a retry after a lost ack, or a second worker): nothing to add.
      await conn.rollback();
      return { kind: 'duplicate' } as const;
    }
    const inserted = await batchInsert(conn, INSERT_CASES_SQL, caseRows(sweepId, r));
    if (inserted !== r.count) throw new Error(`chunk ${r.chunkIndex}: ${inserted} of ${r.count} case rows inserted`);
    const marks = frontMarkRows(sweepId, r);
    if (marks.length) await batchInsert(conn, INSERT_MARKS_SQL, marks);

    const [sweep] = await conn.query('SELECT status FROM sweeps WHERE id = ? FOR UPDATE', [sweepId]);
    if (!sweep || (sweep.status !== 'queued' && sweep.status !== 'running')) {
      await conn.rollback();
      return { kind: 'refused', status: sweep?.status ?? 'deleted' } as const;
    }
    await conn.query(
      `UPDATE sweeps SET
         done_cases = done_cases + ?, feasible_cases = feasible_cases + ?, failed_cases = failed_cases + ?,
         chunks_done = chunks_done + 1, status = 'running',
         started_at = COALESCE(started_at, UTC_TIMESTAMP()), updated_at = UTC_TIMESTAMP()
       WHERE id = ?`,
      [r.count, r.feasibleCount, r.failedCount, sweepId]
    );
    const claim = await conn.query(
      `UPDATE sweeps SET finalize_claimed_at = UTC_TIMESTAMP()
       WHERE id = ? AND chunks_done = chunk_count AND finalize_claimed_at IS NULL`,
      [sweepId]
    );
    const writeMs = performance.now() - t0;
    await conn.query('UPDATE sweep_chunks SET write_ms = ? WHERE sweep_id = ? AND chunk_index = ?', [
      Math.round(writeMs),
      sweepId,
      r.chunkIndex
    ]);
    return { kind: 'committed', claimedCompletion: Number(claim.affectedRows) === 1, writeMs } as const;
  });
}

/** Chunk indexes already committed for a sweep. */
export async function committedChunks(sweepId: number): Promise<Set<number>> {
  return withConnection(async (conn) => {
    const rows = await conn.query({ sql: 'SELECT chunk_index FROM sweep_chunks WHERE sweep_id = ?', rowsAsArray: true }, [sweepId]);
    return new Set((rows as number[][]).map((r) => r[0]));
  });
}

/** Case rows of a sweep, counted (tests and status checks). */
export async function storedCaseCount(sweepId: number): Promise<number> {
  return withConnection(async (conn) => {
    const [row] = await conn.query('SELECT COUNT(*) AS n FROM sweep_cases WHERE sweep_id = ?', [sweepId]);
    return Number(row.n);
  });
}

/** Deletes a sweep's case rows in slices (no long lock), its chunk ledger, then the sweep (cascade: share links). */
export async function deleteSweepRows(sweepId: number) {
  await withConnection(async (conn) => {
    for (;;) {
      const r = await conn.query('DELETE FROM sweep_cases WHERE sweep_id = ? LIMIT 20000', [sweepId]);
      if (Number(r.affectedRows) === 0) break;
    }
    await conn.query('DELETE FROM sweep_chunks WHERE sweep_id = ?', [sweepId]);
    await conn.query('DELETE FROM sweep_front_marks WHERE sweep_id = ?', [sweepId]);
    await conn.query('DELETE FROM sweeps WHERE id = ?', [sweepId]);
  });
}

export interface SweepWorkRow {
  id: number;
  status: string;
  runGen: number;
  spec: unknown;
  /** The spec as stored (JSON text), passed to compute threads as is. */
  specJson: string;
  chunkSize: number;
  chunkCount: number;
  chunksDone: number;
  totalCases: number;
  feasibleCases: number;
  failedCases: number;
  finalizeClaimed: boolean;
  notified: boolean;
  ownerId: string | null;
  workspaceId: string;
  name: string;
  createdAt: Date;
}

/** The fields a worker needs, read through the raw pool. */
export async function loadSweepRow(sweepId: number): Promise<SweepWorkRow | null> {
  return withConnection(async (conn) => {
    const [r] = await conn.query(
      `SELECT id, status, run_gen, spec, chunk_size, chunk_count, chunks_done, total_cases, feasible_cases,
              failed_cases, finalize_claimed_at, notified_at, owner_id, workspace_id, name, created_at
       FROM sweeps WHERE id = ?`,
      [sweepId]
    );
    if (!r) return null;
    const specJson = typeof r.spec === 'string' ? r.spec : JSON.stringify(r.spec);
    return {
      id: Number(r.id),
      status: r.status,
      runGen: Number(r.run_gen),
      spec: JSON.parse(specJson),
      specJson,
      chunkSize: Number(r.chunk_size),
      chunkCount: Number(r.chunk_count),
      chunksDone: Number(r.chunks_done),
      totalCases: Number(r.total_cases),
      feasibleCases: Number(r.feasible_cases),
      failedCases: Number(r.failed_cases),
      finalizeClaimed: r.finalize_claimed_at !== null,
      notified: r.notified_at !== null,
      ownerId: r.owner_id,
      workspaceId: r.workspace_id,
      name: r.name,
      createdAt: new Date(r.created_at)
    };
  });
}

/** Marks a sweep failed (unless it already ended) with an error message. */
export async function markSweepFailed(sweepId: number, message: string) {
  await withConnection((conn) =>
    conn.query(
      `UPDATE sweeps SET status = 'failed', error = ?, finished_at = UTC_TIMESTAMP(), updated_at = UTC_TIMESTAMP()
       WHERE id = ? AND status IN ('draft', 'queued', 'running', 'paused')`,
      [message.slice(0, 4000), sweepId]
    )
  );
}
