/**
 * Constraint limits on the Pareto plot: which sweep constraints bound a plotted quantity
 * (`limitsOf`, SI), and the dashed lines they become on the axes in the user's display units
 * (`limitLines`), each saying which side of it is infeasible. Pure, so it is tested on its own.
 */
import { G0 } from '$lib/physics/constants';
import type { SweepSpec } from '$lib/sweep/spec';
import type { UnitSystem } from '$lib/units';
import { fmtWithUnit, metricInfo, toUnits } from './quantities';

/** Result quantities that a constraint bounds (result keys of the sweep API). */
export type LimitMetric = 'liftoffThrustToWeight' | 'maxDynamicPressure' | 'maxAxialAcceleration' | 'payloadMass' | 'glow';

export interface PlotLimit {
  metric: LimitMetric;
  /** 'min': values below are infeasible; 'max': values above are. */
  bound: 'min' | 'max';
  /** The limit in SI (kg, Pa, m/s², or a plain ratio). */
  value: number;
  /** The limit as the spec gave it when that was in another unit ("6 g"). */
  given?: string;
}

type Constraints = NonNullable<SweepSpec['constraints']>;

/**
 * Every constraint of the spec schema, mapped to the quantity it bounds. A Record over the
 * schema's keys, so a constraint added to the schema without a line here fails to compile.
 */
const FROM_SPEC: Record<keyof Constraints, { metric: LimitMetric; bound: 'min' | 'max'; toSI?: (v: number) => number; given?: (v: number) => string }> = {
  minLiftoffThrustToWeight: { metric: 'liftoffThrustToWeight', bound: 'min' },
  maxDynamicPressure: { metric: 'maxDynamicPressure', bound: 'max' },
  maxAxialAcceleration: { metric: 'maxAxialAcceleration', bound: 'max' },
  // Multiples of standard gravity, G0 = 9.80665 m/s² (the schema's own conversion).
  maxAxialAccelerationG: { metric: 'maxAxialAcceleration', bound: 'max', toSI: (v) => v * G0, given: (v) => `${v} g` },
  payloadFloor: { metric: 'payloadMass', bound: 'min' },
  glowCeiling: { metric: 'glow', bound: 'max' }
};

/**
 * The plot limits of a sweep's constraints, in SI. Missing and non-finite entries are left
 * out; an acceleration limit given both ways (which the schema refuses) keeps the m/s² one.
 */
export function limitsOf(constraints: Partial<Record<keyof Constraints, number | null>> | null | undefined): PlotLimit[] {
  if (!constraints) return [];
  const out: PlotLimit[] = [];
  for (const key of Object.keys(FROM_SPEC) as (keyof Constraints)[]) {
    const v = constraints[key];
    if (typeof v !== 'number' || !Number.isFinite(v)) continue;
    if (key === 'maxAxialAccelerationG' && typeof constraints.maxAxialAcceleration === 'number') continue;
    const m = FROM_SPEC[key];
    const limit: PlotLimit = { metric: m.metric, bound: m.bound, value: m.toSI ? m.toSI(v) : v };
    if (m.given) limit.given = m.given(v);
    out.push(limit);
  }
  return out;
}

const NAMES: Record<LimitMetric, string> = {
  liftoffThrustToWeight: 'lift-off T/W minimum',
  maxDynamicPressure: 'max-Q limit',
  maxAxialAcceleration: 'axial acceleration limit',
  payloadMass: 'payload floor',
  glow: 'GLOW ceiling'
};

/** "max-Q limit 45 kPa", "axial acceleration limit 6 g (58.84 m/s²)", in the user's units. */
export function limitLabel(limit: PlotLimit, units: UnitSystem): string {
  const shown = fmtWithUnit(metricInfo(limit.metric).kind, limit.value, units);
  return limit.given ? `${NAMES[limit.metric]} ${limit.given} (${shown})` : `${NAMES[limit.metric]} ${shown}`;
}

/** Lowest and highest plotted value on one axis, display units; null when nothing is plotted. */
export type Extent = [number, number] | null;

export function extentOf(values: Iterable<number>): Extent {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return lo <= hi ? [lo, hi] : null;
}

export interface LimitLine {
  axis: 'x' | 'y';
  metric: LimitMetric;
  bound: 'min' | 'max';
  /** Where the line sits, in the axis's display units. */
  value: number;
  /** "GLOW ceiling 45,000 kg". */
  label: string;
  /** "infeasible to the right", "infeasible below"… */
  side: string;
  /** The text drawn beside the line, with the infeasible side. */
  text: string;
  /**
   * Null when the line is drawn. Otherwise the limit lies too far beyond the plotted cases to
   * draw without squashing them, and this says on which side of it they all are.
   */
  offPlot: null | 'feasible' | 'infeasible';
}

/**
 * A limit this far beyond the plotted cases (as a share of their spread) is still drawn, the
 * axis stretched to reach it; one further off is listed as off the plot instead.
 */
export const REACH = 0.25;

/**
 * The limit lines of the plotted axes: a limit is drawn on an axis that shows its quantity
 * (on both, if both do). `extent` is the spread of the plotted values on each axis (display
 * units); without it every line counts as drawn.
 */
export function limitLines(
  limits: readonly PlotLimit[],
  x: string,
  y: string,
  units: UnitSystem,
  extent: { x: Extent; y: Extent } = { x: null, y: null }
): LimitLine[] {
  const out: LimitLine[] = [];
  for (const axis of ['x', 'y'] as const) {
    const key = axis === 'x' ? x : y;
    for (const l of limits) {
      if (l.metric !== key) continue;
      const value = toUnits(metricInfo(l.metric).kind, l.value, units);
      const label = limitLabel(l, units);
      const side = axis === 'x' ? (l.bound === 'max' ? 'infeasible to the right' : 'infeasible to the left') : l.bound === 'max' ? 'infeasible above' : 'infeasible below';
      const text = axis === 'x' ? (l.bound === 'max' ? `${label} · infeasible →` : `← infeasible · ${label}`) : `${label} · ${side}`;
      out.push({ axis, metric: l.metric, bound: l.bound, value, label, side, text, offPlot: offPlot(value, l.bound, extent[axis]) });
    }
  }
  return out;
}

function offPlot(value: number, bound: 'min' | 'max', e: Extent): LimitLine['offPlot'] {
  if (!e) return null;
  const [lo, hi] = e;
  const reach = REACH * (hi > lo ? hi - lo : Math.abs(lo) || 1);
  if (value > hi + reach) return bound === 'max' ? 'feasible' : 'infeasible';
  if (value < lo - reach) return bound === 'max' ? 'infeasible' : 'feasible';
  return null;
}

/**
 * Axis ends that bring the drawn lines lying outside the plotted cases into view (with a
 * small margin past the line); an end that needs no stretching is left to the chart.
 */
export function axisBounds(lines: readonly LimitLine[], extent: { x: Extent; y: Extent }): Record<'x' | 'y', { min?: number; max?: number }> {
  const out: Record<'x' | 'y', { min?: number; max?: number }> = { x: {}, y: {} };
  for (const l of lines) {
    const e = extent[l.axis];
    if (l.offPlot || !e) continue;
    const [lo, hi] = e;
    const b = out[l.axis];
    if (l.value > hi) b.max = Math.max(b.max ?? -Infinity, l.value + 0.05 * (l.value - lo));
    if (l.value < lo) b.min = Math.min(b.min ?? Infinity, l.value - 0.05 * (hi - l.value));
  }
  return out;
}
