/**
 * Reading results: sorted, filtered pages of cases (keyset or offset), the front (rank 1 when
 * completed, the merged per-chunk fronts while running), and the CSV export stream.
 * Every ORDER BY is on (sweep_id, <indexed column>, case_index), which the (sweep_id, column)
 * secondary index serves directly (InnoDB appends the primary key to it).
 */
import type { PoolConnection } from 'mariadb';
import { z } from 'zod';
import { caseReasonCodes } from '../../sweep/evaluate';
import { planOf, type CaseDimension } from '../../sweep/cases';
import { mergeFronts, type FrontMember } from '../../sweep/pareto';
import type { SweepSpec } from '../../sweep/spec';
import type { Sweep } from '../db/models';
import { COLUMN_BY_KEY, PARAM_COLUMNS, RESULT_COLUMNS } from './columns';
import { InputError, parseOr400 } from './http';
import { withConnection } from './pool';

/** Sort keys: the indexed result columns, the Pareto rank and the case index. */
export const SORT_KEYS = ['caseIndex', 'paretoRank', ...RESULT_COLUMNS.filter((c) => c.indexed).map((c) => c.key)] as const;
const SORT_COLUMN: Record<string, string> = {
  caseIndex: 'case_index',
  paretoRank: 'pareto_rank',
  ...Object.fromEntries(RESULT_COLUMNS.filter((c) => c.indexed).map((c) => [c.key, c.column]))
};
/** Filterable: every result column. */
export const FILTER_KEYS = RESULT_COLUMNS.map((c) => c.key);

const SELECT_COLUMNS = [
  'case_index',
  'chunk_index',
  'feasible',
  'failed',
  'fail_mask',
  'reasons',
  'chunk_front',
  'pareto_rank',
  ...RESULT_COLUMNS.map((c) => c.column),
  ...PARAM_COLUMNS
].join(', ');

export interface CaseRow {
  caseIndex: number;
  chunkIndex: number;
  feasible: boolean;
  failed: boolean;
  reasons: string[];
  /** Failure message of a failed case (evaluation error), else null. */
  error: string | null;
  paretoRank: number | null;
  /** Non-dominated within its chunk (the live front's candidates). */
  chunkFront: boolean;
  values: Record<string, number | null>;
  /** Swept values by parameter path; catalogue choices by entry id. */
  params: Record<string, number | string | null>;
}

export function dimensionsOf(spec: SweepSpec): readonly CaseDimension[] {
  return planOf(spec).dimensions;
}

export function toCaseRow(r: Record<string, unknown>, dims: readonly CaseDimension[]): CaseRow {
  const values: Record<string, number | null> = {};
  for (const c of RESULT_COLUMNS) values[c.key] = r[c.column] === null ? null : Number(r[c.column]);
  const params: Record<string, number | string | null> = {};
  dims.forEach((d, j) => {
    const v = r[`p${j}`];
    if (v === null || v === undefined) params[d.path] = null;
    else if (d.kind === 'choices') params[d.path] = d.options[Number(v)]?.id ?? null;
    else params[d.path] = Number(v);
  });
  const failed = Number(r.failed) === 1;
  const text = String(r.reasons ?? '');
  return {
    caseIndex: Number(r.case_index),
    chunkIndex: Number(r.chunk_index),
    feasible: Number(r.feasible) === 1,
    failed,
    reasons: failed ? ['EVALUATION_FAILED'] : [...caseReasonCodes(Number(r.fail_mask))],
    error: failed ? text.replace(/^EVALUATION_FAILED:\s*/, '') : null,
    paretoRank: r.pareto_rank === null ? null : Number(r.pareto_rank),
    chunkFront: Number(r.chunk_front) === 1,
    values,
    params
  };
}

const numParam = (label: string) =>
  z.coerce.number({ error: `${label} must be a number` }).refine(Number.isFinite, `${label} must be a finite number`);

/** Query of GET /api/sweeps/[id]/cases. */
export interface CaseQuery {
  sort: string;
  dir: 'asc' | 'desc';
  limit: number;
  offset: number;
  /** Keyset cursor from a previous page's `next` (replaces offset). */
  after: { value: number | null; caseIndex: number } | null;
  feasibleOnly: boolean;
  rank: number | null;
  min: Record<string, number>;
  max: Record<string, number>;
  /** Filters on swept parameters by path: a numeric range, or catalogue choices by entry id. */
  param: Record<string, ParamFilter>;
}

export interface ParamFilter {
  min?: number;
  max?: number;
  is?: string[];
}

const baseQuery = z.object({
  sort: z.enum(SORT_KEYS as unknown as [string, ...string[]], { error: `sort must be one of ${SORT_KEYS.join(', ')}` }).default('caseIndex'),
  dir: z.enum(['asc', 'desc'], { error: 'dir must be asc or desc' }).default('asc'),
  limit: z.coerce.number({ error: 'limit must be a number' }).int('limit must be a whole number').min(1, 'limit must be at least 1').max(1000, 'limit must be at most 1000').default(50),
  offset: z.coerce.number({ error: 'offset must be a number' }).int().min(0, 'offset must be at least 0').max(2_000_000).default(0),
  after: z.string().max(200).optional(),
  feasible: z.enum(['0', '1', 'true', 'false'], { error: 'feasible must be 1 or 0' }).optional(),
  rank: z.coerce.number({ error: 'rank must be a number' }).int().min(1, 'rank must be at least 1').optional()
});

/**
 * Parses ?sort=glow&dir=asc&limit=50&feasible=1&min.glow=1000&max.dryMass=5000&after=<cursor>;
 * swept parameters filter by path: min.param.stages.0.structuralCoefficient=0.07, and catalogue
 * choices by entry ids: is.param.stages.1.propulsion=12,14.
 */
export function parseCaseQuery(params: URLSearchParams): CaseQuery {
  const plain: Record<string, string> = {};
  const min: Record<string, number> = {};
  const max: Record<string, number> = {};
  const param: Record<string, ParamFilter> = {};
  const errors: Record<string, string> = {};
  for (const [k, v] of params) {
    const pm = /^(min|max|is)\.param\.([\w.]{1,120})$/.exec(k);
    if (pm) {
      const f = (param[pm[2]] ??= {});
      if (pm[1] === 'is') {
        const ids = v.split(',').map((x) => x.trim()).filter(Boolean);
        if (!ids.length || ids.length > 100 || ids.some((x) => x.length > 64)) errors[k] = `${k} must list one to 100 entry ids, separated by commas`;
        else f.is = ids;
      } else {
        const r = numParam(k).safeParse(v);
        if (!r.success) errors[k] = r.error.issues[0].message;
        else f[pm[1] as 'min' | 'max'] = r.data;
      }
      continue;
    }
    const m = /^(min|max)\.(\w+)$/.exec(k);
    if (m) {
      if (!COLUMN_BY_KEY.has(m[2])) {
        errors[k] = `unknown result column "${m[2]}"; one of ${FILTER_KEYS.join(', ')}`;
        continue;
      }
      const r = numParam(k).safeParse(v);
      if (!r.success) errors[k] = r.error.issues[0].message;
      else (m[1] === 'min' ? min : max)[m[2]] = r.data;
    } else plain[k] = v;
  }
  const base = baseQuery.safeParse(plain);
  if (!base.success) for (const i of base.error.issues) errors[i.path.join('.') || '_'] ??= i.message;
  if (Object.keys(errors).length || !base.success) throw new InputError('Invalid query', errors);
  const q = base.data;
  let after: CaseQuery['after'] = null;
  if (q.after) {
    const m = /^(null|-?[0-9.eE+-]+)~([0-9]+)$/.exec(q.after);
    if (!m || (m[1] !== 'null' && !Number.isFinite(Number(m[1])))) throw new InputError('Invalid query', { after: 'after must be a cursor from a previous page' });
    after = { value: m[1] === 'null' ? null : Number(m[1]), caseIndex: Number(m[2]) };
  }
  return {
    sort: q.sort,
    dir: q.dir,
    limit: q.limit,
    offset: after ? 0 : q.offset,
    after,
    feasibleOnly: q.feasible === '1' || q.feasible === 'true',
    rank: q.rank ?? null,
    min,
    max,
    param
  };
}

type ParamCondition = { column: string; op: '>=' | '<=' | 'IN'; value: number | number[] };

/**
 * The parameter filters as column conditions on p0..p9: a path must be one of the sweep's swept
 * parameters, a range applies to numeric ones and entry ids to catalogue choices (stored as the
 * option's position).
 */
export function paramConditions(param: CaseQuery['param'], dims: readonly CaseDimension[]): ParamCondition[] {
  const out: ParamCondition[] = [];
  const errors: Record<string, string> = {};
  for (const [path, f] of Object.entries(param)) {
    const j = dims.findIndex((d) => d.path === path);
    const key = (op: string) => `${op}.param.${path}`;
    if (j < 0) {
      errors[key(f.is ? 'is' : f.min !== undefined ? 'min' : 'max')] = `"${path}" is not swept here; one of ${dims.map((d) => d.path).join(', ') || '(none)'}`;
      continue;
    }
    const d = dims[j];
    const column = PARAM_COLUMNS[j];
    if (d.kind === 'choices') {
      if (f.min !== undefined || f.max !== undefined) errors[key(f.min !== undefined ? 'min' : 'max')] = `${path} is a catalogue choice; filter it with is.param.${path}=<entry ids>`;
      if (f.is) {
        const positions: number[] = [];
        for (const id of f.is) {
          const at = d.options.findIndex((o) => o.id === id);
          if (at < 0) errors[key('is')] = `"${id}" is not one of the choices of ${path} (${d.options.map((o) => o.id).join(', ')})`;
          else positions.push(at);
        }
        out.push({ column, op: 'IN', value: positions });
      }
    } else {
      if (f.is) errors[key('is')] = `${path} is numeric; filter it with min.param.${path} / max.param.${path}`;
      if (f.min !== undefined) out.push({ column, op: '>=', value: f.min });
      if (f.max !== undefined) out.push({ column, op: '<=', value: f.max });
    }
  }
  if (Object.keys(errors).length) throw new InputError('Invalid query', errors);
  return out;
}

function whereClause(
  sweepId: number,
  q: Pick<CaseQuery, 'feasibleOnly' | 'rank' | 'min' | 'max' | 'sort'>,
  params: readonly ParamCondition[] = []
) {
  const where = ['sweep_id = ?'];
  const args: unknown[] = [sweepId];
  if (q.feasibleOnly) where.push('feasible = 1');
  if (q.rank !== null) {
    where.push('pareto_rank = ?');
    args.push(q.rank);
  }
  for (const [k, v] of Object.entries(q.min)) {
    where.push(`${COLUMN_BY_KEY.get(k)!.column} >= ?`);
    args.push(v);
  }
  for (const [k, v] of Object.entries(q.max)) {
    where.push(`${COLUMN_BY_KEY.get(k)!.column} <= ?`);
    args.push(v);
  }
  for (const c of params) {
    if (c.op === 'IN') {
      const list = c.value as number[];
      where.push(list.length ? `${c.column} IN (${list.map(() => '?').join(',')})` : 'FALSE');
      args.push(...list);
    } else {
      // Stored as DOUBLE from the plan's own values; compare with a relative margin so a typed
      // 0.07 matches the stored 0.07000000000000001 of a stepped level.
      const v = c.value as number;
      const eps = Math.abs(v) * 1e-9;
      where.push(`${c.column} ${c.op} ?`);
      args.push(c.op === '>=' ? v - eps : v + eps);
    }
  }
  // Rows without a value in the sort column (failed cases) are left out of a sorted page.
  if (q.sort !== 'caseIndex') where.push(`${SORT_COLUMN[q.sort]} IS NOT NULL`);
  return { where, args };
}

/** Counting beyond this many matching rows is not worth a full scan: `totalIsExact` turns false. */
const COUNT_LIMIT = 10_000;

export async function casePage(sweep: Sweep, q: CaseQuery) {
  const dims = dimensionsOf(sweep.spec as SweepSpec);
  const col = SORT_COLUMN[q.sort];
  const dir = q.dir === 'asc' ? 'ASC' : 'DESC';
  const cmp = q.dir === 'asc' ? '>' : '<';
  const { where, args } = whereClause(sweep.id, q, paramConditions(q.param, dims));
  const pageWhere = [...where];
  const pageArgs = [...args];
  if (q.after) {
    if (q.sort === 'caseIndex') {
      pageWhere.push(`case_index ${cmp} ?`);
      pageArgs.push(q.after.caseIndex);
    } else {
      pageWhere.push(`(${col} ${cmp} ? OR (${col} = ? AND case_index ${cmp} ?))`);
      pageArgs.push(q.after.value, q.after.value, q.after.caseIndex);
    }
  }
  const order = q.sort === 'caseIndex' ? `case_index ${dir}` : `${col} ${dir}, case_index ${dir}`;
  return withConnection(async (conn) => {
    // Deferred join: find the page's keys on the (sweep_id, column) index first, then read only
    // those rows — an OFFSET then skips index entries, not whole rows.
    const keys = (await conn.query(
      { sql: `SELECT case_index FROM sweep_cases WHERE ${pageWhere.join(' AND ')} ORDER BY ${order} LIMIT ? OFFSET ?`, rowsAsArray: true },
      [...pageArgs, q.limit, q.offset]
    )) as number[][];
    const byIndex = new Map<number, Record<string, unknown>>();
    if (keys.length) {
      const found = (await conn.query(
        `SELECT ${SELECT_COLUMNS} FROM sweep_cases WHERE sweep_id = ? AND case_index IN (${keys.map(() => '?').join(',')})`,
        [sweep.id, ...keys.map((k) => k[0])]
      )) as Record<string, unknown>[];
      for (const r of found) byIndex.set(Number(r.case_index), r);
    }
    const rows = keys.map((k) => byIndex.get(Number(k[0]))!).filter(Boolean);
    const cases = (rows as Record<string, unknown>[]).map((r) => toCaseRow(r, dims));
    const last = cases.at(-1);
    const next =
      last && cases.length === q.limit
        ? `${q.sort === 'caseIndex' ? 'null' : (last.values[q.sort] ?? (q.sort === 'paretoRank' ? last.paretoRank : null))}~${last.caseIndex}`
        : null;
    const { total, exact } = await countMatching(conn, sweep, q, where, args);
    return { total, totalIsExact: exact, sort: q.sort, dir: q.dir, limit: q.limit, offset: q.offset, next, cases };
  });
}

async function countMatching(conn: PoolConnection, sweep: Sweep, q: CaseQuery, where: string[], args: unknown[]) {
  const filtered = q.rank !== null || Object.keys(q.min).length > 0 || Object.keys(q.max).length > 0 || Object.keys(q.param).length > 0;
  // The counters already hold the unfiltered totals. The sort columns are never null except
  // in failed cases (the evaluator's flat result is finite), which a sorted page leaves out.
  if (!filtered) {
    const base = q.feasibleOnly ? sweep.feasibleCases : sweep.doneCases;
    // Ranks exist for the feasible cases once the sweep is completed.
    if (q.sort === 'paretoRank') return { total: sweep.status === 'completed' ? sweep.feasibleCases : 0, exact: true };
    return { total: q.sort === 'caseIndex' || q.feasibleOnly ? base : base - sweep.failedCases, exact: true };
  }
  const [r] = await conn.query(`SELECT COUNT(*) AS n FROM (SELECT 1 FROM sweep_cases WHERE ${where.join(' AND ')} LIMIT ${COUNT_LIMIT + 1}) t`, args);
  const n = Number(r.n);
  return n > COUNT_LIMIT ? { total: COUNT_LIMIT, exact: false } : { total: n, exact: true };
}

export async function caseRow(sweep: Sweep, caseIndex: number): Promise<CaseRow | null> {
  const dims = dimensionsOf(sweep.spec as SweepSpec);
  return withConnection(async (conn) => {
    const [r] = await conn.query(`SELECT ${SELECT_COLUMNS} FROM sweep_cases WHERE sweep_id = ? AND case_index = ?`, [sweep.id, caseIndex]);
    return r ? toCaseRow(r, dims) : null;
  });
}

/** Most front members returned; a 4-objective front of a million cases can be far larger. */
export const FRONT_LIMIT = 5_000;

/**
 * The Pareto front: rank 1 of a completed sweep; while it runs, the non-dominated set of the
 * union of every stored chunk's own front (sweep_front_marks), merged here with SWEEP-CORE's
 * mergeFronts — the same set the final ranking gives for the cases stored so far.
 */
export async function front(sweep: Sweep) {
  const spec = sweep.spec as SweepSpec;
  const dims = dimensionsOf(spec);
  const objectives = spec.objectives.map((o) => ({ ...o, column: COLUMN_BY_KEY.get(o.metric)!.column }));
  const directions = objectives.map((o) => o.direction);
  const ranked = sweep.status === 'completed';
  return withConnection(async (conn) => {
    let rows: Record<string, unknown>[];
    let candidates: number;
    if (ranked) {
      rows = await conn.query(
        `SELECT ${SELECT_COLUMNS} FROM sweep_cases WHERE sweep_id = ? AND pareto_rank = 1 ORDER BY case_index LIMIT ${FRONT_LIMIT + 1}`,
        [sweep.id]
      );
      candidates = rows.length;
    } else {
      const live = await liveFront(conn, sweep, objectives.length, directions);
      candidates = live.candidates;
      const merged = live.members.slice(0, FRONT_LIMIT + 1);
      rows = [];
      for (let k = 0; k < merged.length; k += 1000) {
        const ids = merged.slice(k, k + 1000).map((m) => m.index);
        rows.push(
          ...((await conn.query(
            `SELECT ${SELECT_COLUMNS} FROM sweep_cases WHERE sweep_id = ? AND case_index IN (${ids.map(() => '?').join(',')}) ORDER BY case_index`,
            [sweep.id, ...ids]
          )) as Record<string, unknown>[])
        );
      }
    }
    const truncated = rows.length > FRONT_LIMIT;
    return {
      live: !ranked,
      status: sweep.status,
      objectives: spec.objectives,
      candidates,
      size: Math.min(rows.length, FRONT_LIMIT),
      truncated,
      cases: rows.slice(0, FRONT_LIMIT).map((r) => toCaseRow(r, dims))
    };
  });
}

/**
 * The merged live front of a running sweep, kept per process and grown incrementally: each call
 * reads the chunk ledger, then only the marks of chunks not merged yet (a chunk's marks commit
 * with its ledger row, so a listed chunk's marks are all there). A poll with no new chunk costs
 * one ledger read; a fresh process merges everything once.
 */
interface LiveEntry {
  merged: Set<number>;
  members: FrontMember[];
  candidates: number;
}
const liveFronts = new Map<string, LiveEntry>();

/** Forgets the merged live fronts (benchmarks measure the cold path with it). */
export function clearLiveFronts() {
  liveFronts.clear();
}

async function liveFront(conn: PoolConnection, sweep: Sweep, m: number, directions: ('min' | 'max')[]) {
  const key = `${sweep.id}-${new Date(sweep.createdAt).getTime()}`;
  let entry = liveFronts.get(key);
  const chunks = ((await conn.query({ sql: 'SELECT chunk_index FROM sweep_chunks WHERE sweep_id = ?', rowsAsArray: true }, [sweep.id])) as number[][]).map((r) => Number(r[0]));
  const fresh = entry ? chunks.filter((c) => !entry!.merged.has(c)) : chunks;
  if (!entry || fresh.length) {
    const cols = Array.from({ length: m }, (_, j) => `o${j + 1}`).join(', ');
    let rows: (number | null)[][];
    if (!entry || fresh.length > 200) {
      rows = await conn.query({ sql: `SELECT case_index, ${cols} FROM sweep_front_marks WHERE sweep_id = ?`, rowsAsArray: true }, [sweep.id]);
    } else {
      // Contiguous chunk runs → case-index ranges (chunk c holds cases c·size ≤ i < (c+1)·size).
      fresh.sort((a, b) => a - b);
      const ranges: [number, number][] = [];
      for (const c of fresh) {
        const last = ranges.at(-1);
        if (last && last[1] === c - 1) last[1] = c;
        else ranges.push([c, c]);
      }
      rows = await conn.query(
        {
          sql: `SELECT case_index, ${cols} FROM sweep_front_marks WHERE sweep_id = ? AND (${ranges.map(() => 'case_index BETWEEN ? AND ?').join(' OR ')})`,
          rowsAsArray: true
        },
        [sweep.id, ...ranges.flatMap(([a, b]) => [a * sweep.chunkSize, (b + 1) * sweep.chunkSize - 1])]
      );
    }
    const incoming: FrontMember[] = [];
    for (const r of rows) {
      const values = r.slice(1).map((v) => (v === null ? NaN : Number(v)));
      if (values.every(Number.isFinite)) incoming.push({ index: Number(r[0]), values });
    }
    const full = !entry || fresh.length > 200;
    entry = {
      merged: new Set(chunks),
      members: mergeFronts(full ? [] : entry!.members, incoming, directions),
      candidates: (full ? 0 : entry!.candidates) + incoming.length
    };
    if (liveFronts.size >= 32) liveFronts.delete(liveFronts.keys().next().value!);
    liveFronts.set(key, entry);
  }
  return entry;
}

// ---------------------------------------------------------------------------------------------
// CSV export

/** A cell that a spreadsheet would read as a formula gets a leading apostrophe (OWASP CSV injection). */
export function csvCell(v: unknown): string {
  if (v === null || v === undefined) return '';
  let s = typeof v === 'number' ? (Number.isFinite(v) ? String(v) : '') : String(v);
  if (typeof v !== 'number' && /^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * The whole sweep as CSV, pulled page by page by keyset on case_index as the client reads
 * (ReadableStream pull), so memory stays one page whatever the sweep size.
 */
/**
 * The sweep's cases as CSV in case order, optionally only those matching the filters of a case
 * query (feasible, rank, result ranges, swept parameters; its sort and paging are ignored). Bad
 * filters throw InputError here, before the stream starts.
 */
export function exportCsv(sweep: Sweep, filters: Pick<CaseQuery, 'feasibleOnly' | 'rank' | 'min' | 'max' | 'param'> | null = null, pageSize = 2_000): ReadableStream<Uint8Array> {
  const dims = dimensionsOf(sweep.spec as SweepSpec);
  const { where, args } = filters
    ? whereClause(sweep.id, { ...filters, sort: 'caseIndex' }, paramConditions(filters.param, dims))
    : { where: ['sweep_id = ?'], args: [sweep.id] };
  const enc = new TextEncoder();
  const header = [
    'case_index',
    'feasible',
    'failed',
    'pareto_rank',
    'reasons',
    ...dims.map((d) => d.path),
    ...RESULT_COLUMNS.map((c) => (c.unit ? `${c.key} [${c.unit}]` : c.key))
  ];
  let after = -1;
  let done = false;
  return new ReadableStream<Uint8Array>({
    start(controller) {
      controller.enqueue(enc.encode(header.map(csvCell).join(',') + '\r\n'));
    },
    async pull(controller) {
      if (done) return;
      try {
        const rows = (await withConnection((conn) =>
          conn.query(`SELECT ${SELECT_COLUMNS} FROM sweep_cases WHERE ${where.join(' AND ')} AND case_index > ? ORDER BY case_index LIMIT ?`, [
            ...args,
            after,
            pageSize
          ])
        )) as Record<string, unknown>[];
        if (rows.length === 0) {
          done = true;
          controller.close();
          return;
        }
        let out = '';
        for (const raw of rows) {
          const r = toCaseRow(raw, dims);
          const cells = [
            r.caseIndex,
            r.feasible ? 1 : 0,
            r.failed ? 1 : 0,
            r.paretoRank,
            r.failed ? `EVALUATION_FAILED: ${r.error ?? ''}` : r.reasons.join(' '),
            ...dims.map((d) => r.params[d.path]),
            ...RESULT_COLUMNS.map((c) => r.values[c.key])
          ];
          out += cells.map(csvCell).join(',') + '\r\n';
        }
        after = Number(rows[rows.length - 1].case_index);
        controller.enqueue(enc.encode(out));
      } catch (e) {
        done = true;
        controller.error(e);
      }
    }
  });
}

export { parseOr400 };
