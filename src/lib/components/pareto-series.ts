/**
 * The point sets of the Pareto plot, in display units: infeasible cases, feasible cases off
 * the front (optionally coloured by a third quantity), and the front sorted along the x axis.
 * A case without a finite value on either axis is left out (failed cases, n/a columns).
 */
import { nice, tickStep } from 'd3-array';
import type { UnitSystem } from '$lib/units';
import { metricInfo, toUnits } from './quantities';

export interface PlotCase {
  caseIndex: number;
  feasible: boolean;
  failed?: boolean;
  paretoRank: number | null;
  values: Record<string, number | null>;
}

export type PlotPoint = { x: number; y: number; caseIndex: number; fillColor?: string };

/**
 * Low → high colours of the third quantity: light to dark teal, so no colour of the ramp can be
 * mistaken for the front's orange.
 */
export const RAMP = ['#c9ece8', '#8fdad3', '#4fc2bb', '#1f9d98', '#156565', '#0d3a3b'];

export function rampColor(t: number): string {
  const i = Math.max(0, Math.min(RAMP.length - 1, Math.round(t * (RAMP.length - 1))));
  return RAMP[i];
}

export function colorRange(cases: PlotCase[], key: string): { lo: number; hi: number } | null {
  if (!key) return null;
  let lo = Infinity;
  let hi = -Infinity;
  for (const c of cases) {
    const s = c.values[key];
    if (s != null && Number.isFinite(s)) {
      lo = Math.min(lo, s);
      hi = Math.max(hi, s);
    }
  }
  return Number.isFinite(lo) ? { lo, hi } : null;
}

export function paretoSeries(cloud: PlotCase[], front: PlotCase[], x: string, y: string, color: string, units: UnitSystem) {
  const v = (c: PlotCase, key: string) => {
    const s = c.values[key];
    return s == null || !Number.isFinite(s) ? null : toUnits(metricInfo(key).kind, s, units);
  };
  const range = colorRange([...cloud, ...front], color);
  const points = (list: PlotCase[], useColor: boolean): PlotPoint[] => {
    const out: PlotPoint[] = [];
    for (const c of list) {
      const px = v(c, x);
      const py = v(c, y);
      if (px === null || py === null) continue;
      const p: PlotPoint = { x: px, y: py, caseIndex: c.caseIndex };
      if (useColor && range) {
        const s = c.values[color];
        if (s != null) p.fillColor = rampColor(range.hi > range.lo ? (s - range.lo) / (range.hi - range.lo) : 0.5);
      }
      out.push(p);
    }
    return out;
  };
  const onFront = new Set(front.map((c) => c.caseIndex));
  const rest = cloud.filter((c) => !onFront.has(c.caseIndex));
  return {
    infeasible: points(rest.filter((c) => !c.feasible), false),
    feasible: points(rest.filter((c) => c.feasible), true),
    front: points(front, false).sort((a, b) => a.x - b.x),
    range
  };
}

/**
 * Round bounds and a tick count for a numeric axis spanning lo…hi, so that its ticks fall on
 * 1, 2 or 5 × 10^k (d3-array's nice/tickStep) instead of an even split of the raw extent
 * (15k, 29k, 42k …). Null for an empty or zero-width extent (the chart's own scaling then).
 */
export function niceAxis(lo: number, hi: number, count = 8): { min: number; max: number; tickAmount: number } | null {
  if (!Number.isFinite(lo) || !Number.isFinite(hi) || !(hi > lo)) return null;
  const [min, max] = nice(lo, hi, count);
  const step = tickStep(min, max, count);
  return { min, max, tickAmount: Math.max(1, Math.round((max - min) / step)) };
}
