/**
 * The results table's column filters (table-core ColumnFiltersState) as the query of
 * GET /api/sweeps/[id]/cases: result columns → min.<key>/max.<key>, swept parameters →
 * min.param.<path>/max.param.<path> or is.param.<path>=<entry id>, the feasible column →
 * feasible=1, the rank column → rank=<n>. Range texts are in the user's display units and are
 * converted to SI here; a text that is not a number gives an error naming the field and that
 * end of the range is left out of the query.
 */
import type { ColumnFiltersState } from '@tanstack/table-core';
import type { UnitSystem } from '$lib/units';
import { parseNumber } from '$lib/units';
import { fromUnits, type DisplayKind } from './quantities';

export const PARAM_PREFIX = 'p:';

export interface FilterContext {
  units: UnitSystem;
  /** Header text of a column (names the field in an error). */
  label: (id: string) => string;
  /** Display kind of a result column. */
  metricKind: (key: string) => DisplayKind;
  /** A swept parameter: numeric with its kind, or a catalogue choice. */
  param: (path: string) => { choice: true } | { choice: false; kind: DisplayKind } | undefined;
}

export function filterQuery(filters: ColumnFiltersState, ctx: FilterContext): { params: [string, string][]; errors: Record<string, string> } {
  const params: [string, string][] = [];
  const errors: Record<string, string> = {};
  for (const { id, value } of filters) {
    if (id === 'feasible') {
      if (value === 'yes') params.push(['feasible', '1']);
      continue;
    }
    if (id === 'paretoRank') {
      if (value) params.push(['rank', String(value)]);
      continue;
    }
    let kind: DisplayKind;
    let key: (end: 'min' | 'max') => string;
    if (id.startsWith(PARAM_PREFIX)) {
      const path = id.slice(PARAM_PREFIX.length);
      const p = ctx.param(path);
      if (!p) continue;
      if (p.choice) {
        if (value) params.push([`is.param.${path}`, String(value)]);
        continue;
      }
      kind = p.kind;
      key = (end) => `${end}.param.${path}`;
    } else {
      kind = ctx.metricKind(id);
      key = (end) => `${end}.${id}`;
    }
    const r = (value ?? {}) as { min?: string; max?: string };
    for (const [end, word] of [['min', 'from'], ['max', 'to']] as const) {
      const text = r[end] ?? '';
      if (text.trim() === '') continue;
      const n = parseNumber(text, `${ctx.label(id)} ${word}`);
      if (!n.ok) errors[id] ??= n.error;
      else params.push([key(end), String(fromUnits(kind, n.value, ctx.units))]);
    }
  }
  return { params, errors };
}
