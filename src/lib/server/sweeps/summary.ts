/**
 * The summary stored with a completed sweep, computed in the database (one aggregate scan
 * over the feasible cases, no rows shipped to Node): best case per objective, feasible
 * share, the tally of infeasibility reasons, and the sensitivity of each objective to each
 * swept parameter — Pearson correlation and least-squares slope for numeric parameters, the
 * mean per option for catalogue choices. SWEEP-CORE's in-memory summary (if any) works on
 * arrays; at a million cases the aggregate query is the cheaper place.
 */
import type { PoolConnection } from 'mariadb';
import { CASE_REASON_CODES as REASON_CODES } from '../../sweep/evaluate';
import { planOf } from '../../sweep/cases';
import type { SweepSpec } from '../../sweep/spec';
import { COLUMN_BY_KEY } from './columns';
import { withConnection } from './pool';

export interface SweepSummary {
  totalCases: number;
  feasibleCases: number;
  failedCases: number;
  feasibleShare: number;
  frontSize: number;
  best: { metric: string; direction: 'min' | 'max'; caseIndex: number | null; value: number | null }[];
  reasons: Record<string, number>;
  parameters: { slot: number; path: string; kind: 'numeric' | 'choices'; options?: { id: string; name: string }[] }[];
  sensitivity: {
    parameter: string;
    objective: string;
    /** Pearson correlation over the feasible cases (null when either side is constant). */
    correlation: number | null;
    /** Least-squares slope, objective units per parameter unit. */
    slope: number | null;
    /** Catalogue choices: mean objective per option (null when no feasible case uses it). */
    means?: (number | null)[];
  }[];
  computedAt: string;
}

const f = (x: unknown) => (x === null || x === undefined ? null : Number(x));

export async function buildSummary(sweepId: number, spec: SweepSpec, totals: { total: number; failed: number }): Promise<SweepSummary> {
  const plan = planOf(spec);
  const objectives = spec.objectives.map((o) => ({ ...o, column: COLUMN_BY_KEY.get(o.metric)!.column }));
  const parameters = plan.dimensions.map((d, slot) => ({
    slot,
    path: d.path,
    kind: d.kind === 'choices' ? ('choices' as const) : ('numeric' as const),
    options: d.kind === 'choices' ? d.options.map((o) => ({ id: o.id, name: o.name })) : undefined
  }));

  return withConnection(async (conn: PoolConnection) => {
    // One scan: counts, reason tally, and the moment sums for every (numeric parameter, objective) pair.
    const sel: string[] = ['COUNT(*) AS n', 'SUM(feasible) AS feasible', 'SUM(pareto_rank = 1) AS front'];
    REASON_CODES.forEach((_, i) => sel.push(`SUM((fail_mask >> ${i}) & 1) AS r${i}`));
    const numeric = parameters.filter((p) => p.kind === 'numeric');
    for (const p of numeric) {
      const x = `p${p.slot}`;
      sel.push(`SUM(IF(feasible, ${x}, 0)) AS sx${p.slot}`, `SUM(IF(feasible, ${x}*${x}, 0)) AS sxx${p.slot}`);
      objectives.forEach((o, k) => {
        sel.push(`SUM(IF(feasible, ${x}*${o.column}, 0)) AS sxy${p.slot}_${k}`);
      });
    }
    objectives.forEach((o, k) => sel.push(`SUM(IF(feasible, ${o.column}, 0)) AS sy${k}`, `SUM(IF(feasible, ${o.column}*${o.column}, 0)) AS syy${k}`));
    const [agg] = await conn.query(`SELECT ${sel.join(', ')} FROM sweep_cases WHERE sweep_id = ?`, [sweepId]);
    const nf = Number(agg.feasible ?? 0);

    const reasons: Record<string, number> = {};
    REASON_CODES.forEach((code, i) => {
      const c = Number(agg[`r${i}`] ?? 0);
      if (c > 0) reasons[code] = c;
    });

    const best: SweepSummary['best'] = [];
    for (const o of objectives) {
      const [row] = await conn.query(
        `SELECT case_index, ${o.column} AS v FROM sweep_cases
         WHERE sweep_id = ? AND feasible = 1 AND ${o.column} IS NOT NULL
         ORDER BY ${o.column} ${o.direction === 'min' ? 'ASC' : 'DESC'}, case_index LIMIT 1`,
        [sweepId]
      );
      best.push({ metric: o.metric, direction: o.direction, caseIndex: row ? Number(row.case_index) : null, value: row ? f(row.v) : null });
    }

    const sensitivity: SweepSummary['sensitivity'] = [];
    for (const p of numeric) {
      const sx = Number(agg[`sx${p.slot}`] ?? 0);
      const sxx = Number(agg[`sxx${p.slot}`] ?? 0);
      objectives.forEach((o, k) => {
        const sy = Number(agg[`sy${k}`] ?? 0);
        const syy = Number(agg[`syy${k}`] ?? 0);
        const sxy = Number(agg[`sxy${p.slot}_${k}`] ?? 0);
        // Pearson r and the least-squares slope from the raw moment sums.
        const vx = nf * sxx - sx * sx;
        const vy = nf * syy - sy * sy;
        const cxy = nf * sxy - sx * sy;
        const ok = nf > 1 && vx > 1e-12 * Math.max(1, nf * sxx);
        sensitivity.push({
          parameter: p.path,
          objective: o.metric,
          correlation: ok && vy > 1e-12 * Math.max(1, nf * syy) ? Math.max(-1, Math.min(1, cxy / Math.sqrt(vx * vy))) : null,
          slope: ok ? cxy / vx : null
        });
      });
    }
    for (const p of parameters.filter((q) => q.kind === 'choices')) {
      const rows = await conn.query(
        `SELECT p${p.slot} AS opt, ${objectives.map((o, k) => `AVG(${o.column}) AS m${k}`).join(', ')}
         FROM sweep_cases WHERE sweep_id = ? AND feasible = 1 GROUP BY p${p.slot}`,
        [sweepId]
      );
      objectives.forEach((o, k) => {
        const means: (number | null)[] = p.options!.map(() => null);
        for (const r of rows) if (r.opt !== null && means[Number(r.opt)] !== undefined) means[Number(r.opt)] = f(r[`m${k}`]);
        sensitivity.push({ parameter: p.path, objective: o.metric, correlation: null, slope: null, means });
      });
    }

    return {
      totalCases: totals.total,
      feasibleCases: nf,
      failedCases: totals.failed,
      feasibleShare: totals.total > 0 ? nf / totals.total : 0,
      frontSize: Number(agg.front ?? 0),
      best,
      reasons,
      parameters,
      sensitivity,
      computedAt: new Date().toISOString()
    };
  });
}
