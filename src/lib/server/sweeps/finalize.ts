/**
 * Completion of a sweep, run once by the finalize job after the chunk ledger claimed it:
 * Pareto ranks over the feasible cases (SWEEP-CORE's paretoRanks, in a compute thread),
 * stored per case; the summary; status completed; one e-mail to the owner.
 * Idempotent: a retried finalize recomputes the same ranks and summary, and the e-mail is
 * guarded by `notified_at`.
 */
import { COLUMN_BY_KEY } from './columns';
import { batchInsert } from './store';
import { withConnection } from './pool';
import { buildSummary, type SweepSummary } from './summary';
import type { SweepSpec } from '../../sweep/spec';
import type { Direction } from '../../sweep/pareto';
import type { SweepWorkRow } from './store';

export interface FeasiblePoints {
  indexes: Uint32Array;
  objectives: Float64Array[];
}

export function objectiveColumns(spec: SweepSpec) {
  return spec.objectives.map((o) => {
    const col = COLUMN_BY_KEY.get(o.metric);
    if (!col) throw new Error(`objective ${o.metric} has no result column`);
    return { column: col.column, key: col.key, direction: o.direction };
  });
}

/** Streams the objective values of the feasible cases into typed arrays (no per-row objects kept). */
export async function readFeasiblePoints(sweepId: number, columns: string[], expected: number): Promise<FeasiblePoints> {
  return withConnection(async (conn) => {
    let cap = Math.max(expected, 16);
    let indexes = new Uint32Array(cap);
    let objectives = columns.map(() => new Float64Array(cap));
    let n = 0;
    const stream = conn.queryStream(
      {
        sql: `SELECT case_index, ${columns.join(', ')} FROM sweep_cases WHERE sweep_id = ? AND feasible = 1 ORDER BY case_index`,
        rowsAsArray: true
      },
      [sweepId]
    );
    for await (const row of stream as AsyncIterable<(number | null)[]>) {
      if (n === cap) {
        cap *= 2;
        const grow = <T extends Uint32Array | Float64Array>(a: T): T => {
          const b = new (a.constructor as new (n: number) => T)(cap);
          b.set(a);
          return b;
        };
        indexes = grow(indexes);
        objectives = objectives.map(grow);
      }
      indexes[n] = row[0] as number;
      for (let j = 0; j < columns.length; j++) objectives[j][n] = row[j + 1] ?? NaN;
      n++;
    }
    return { indexes: indexes.slice(0, n), objectives: objectives.map((o) => o.slice(0, n)) };
  });
}

/**
 * Stores ranks through a temporary table and one joined UPDATE: the rows go over the wire
 * with batch() (~100k rows/s) instead of one UPDATE round trip per case.
 */
export async function writeRanks(sweepId: number, indexes: Uint32Array, ranks: Int32Array) {
  await withConnection(async (conn) => {
    await conn.query('DROP TEMPORARY TABLE IF EXISTS tmp_sweep_ranks');
    await conn.query('CREATE TEMPORARY TABLE tmp_sweep_ranks (case_index INT UNSIGNED PRIMARY KEY, pareto_rank INT UNSIGNED NULL) ENGINE=InnoDB');
    try {
      const rows: unknown[][] = new Array(indexes.length);
      for (let i = 0; i < indexes.length; i++) rows[i] = [indexes[i], ranks[i] > 0 ? ranks[i] : null];
      await batchInsert(conn, 'INSERT INTO tmp_sweep_ranks (case_index, pareto_rank) VALUES (?, ?)', rows, 20_000);
      // Slices of case indexes, each its own transaction: one 1M-row UPDATE builds a huge undo
      // log and thrashes the buffer pool.
      for (let k = 0; k < indexes.length; k += 50_000) {
        const lo = indexes[k];
        const hi = indexes[Math.min(indexes.length, k + 50_000) - 1];
        await conn.query(
          `UPDATE sweep_cases c JOIN tmp_sweep_ranks t ON c.sweep_id = ? AND c.case_index = t.case_index
           SET c.pareto_rank = t.pareto_rank WHERE t.case_index BETWEEN ? AND ?`,
          [sweepId, lo, hi]
        );
      }
    } finally {
      await conn.query('DROP TEMPORARY TABLE IF EXISTS tmp_sweep_ranks');
    }
  });
}

export type { SweepSummary };
export { buildSummary };

/**
 * Ranks, stores ranks and summary, and marks the sweep completed (only if still running).
 * `rank` runs the non-dominated sort (in a compute thread in the worker).
 */
export async function completeSweep(
  s: SweepWorkRow,
  spec: SweepSpec,
  rank: (objectives: Float64Array[], directions: Direction[]) => Promise<Int32Array>
) {
  const cols = objectiveColumns(spec);
  const t0 = performance.now();
  const points = await readFeasiblePoints(s.id, cols.map((c) => c.column), s.feasibleCases);
  const t1 = performance.now();
  const ranks = points.indexes.length ? await rank(points.objectives, cols.map((c) => c.direction)) : new Int32Array(0);
  const t2 = performance.now();
  await writeRanks(s.id, points.indexes, ranks);
  const t3 = performance.now();
  const summary = await buildSummary(s.id, spec, { total: s.totalCases, failed: s.failedCases });
  const timings = {
    ranked: points.indexes.length,
    readMs: Math.round(t1 - t0),
    rankMs: Math.round(t2 - t1),
    writeRanksMs: Math.round(t3 - t2),
    summaryMs: Math.round(performance.now() - t3)
  };
  await withConnection(async (conn) => {
    await conn.query(
      `UPDATE sweeps SET status = 'completed', summary = ?, finished_at = UTC_TIMESTAMP(), updated_at = UTC_TIMESTAMP()
       WHERE id = ? AND status = 'running'`,
      [JSON.stringify({ ...summary, timings }), s.id]
    );
    // The ranks now give the front; the live candidates are no longer needed.
    await conn.query('DELETE FROM sweep_front_marks WHERE sweep_id = ?', [s.id]);
  });
  return timings;
}
