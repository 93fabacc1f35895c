/**
 * Keyboard stepping through the Pareto front of the plot, and the sentence that announces the
 * case reached. Only the front is stepped: the cases behind it can be thousands, and the
 * results table is the way to reach them. Pure, so it is tested on its own.
 */
import type { UnitSystem } from '$lib/units';
import type { PlotCase, PlotPoint } from './pareto-series';
import { fmtWithUnit, metricInfo } from './quantities';

export type NavPoint = Pick<PlotPoint, 'x' | 'y' | 'caseIndex'>;

export type NavResult = { kind: 'select'; caseIndex: number } | { kind: 'clear' } | { kind: 'ignore' };

/** The keys `stepFront` answers, for the help text. */
export const NAV_KEYS = ['ArrowLeft', 'ArrowRight', 'ArrowUp', 'ArrowDown', 'Home', 'End', 'PageUp', 'PageDown', 'Escape'] as const;

const byX = (a: NavPoint, b: NavPoint) => a.x - b.x || a.y - b.y || a.caseIndex - b.caseIndex;
const byY = (a: NavPoint, b: NavPoint) => a.y - b.y || a.x - b.x || a.caseIndex - b.caseIndex;

/** The front in stepping order: left to right, ties bottom to top, then by case number. */
export function frontOrder<P extends NavPoint>(points: readonly P[]): P[] {
  return [...points].sort(byX);
}

/**
 * What a key does to the selection (`current`, a case number or null). Left/Right step along
 * the horizontal axis, Up/Down along the vertical one, Home/End jump to the ends of the front
 * left to right, PageUp/PageDown move a tenth of the front right/left (like a slider). From no
 * selection, Right, Up, Home and PageUp start at the low end and the others at the high end;
 * the ends do not wrap. Escape clears a selection; any other key is not the plot's.
 */
export function stepFront(points: readonly NavPoint[], current: number | null, key: string): NavResult {
  const n = points.length;
  const has = current !== null && points.some((p) => p.caseIndex === current);
  if (key === 'Escape') return current !== null ? { kind: 'clear' } : { kind: 'ignore' };
  if (!(NAV_KEYS as readonly string[]).includes(key)) return { kind: 'ignore' };
  if (n === 0) return { kind: 'ignore' };
  const vertical = key === 'ArrowUp' || key === 'ArrowDown';
  const order = [...points].sort(vertical ? byY : byX);
  const at = has ? order.findIndex((p) => p.caseIndex === current) : -1;
  const page = Math.max(1, Math.round(n / 10));
  const clamp = (i: number) => Math.max(0, Math.min(n - 1, i));
  let next: number;
  switch (key) {
    case 'ArrowRight':
    case 'ArrowUp':
      next = at < 0 ? 0 : clamp(at + 1);
      break;
    case 'ArrowLeft':
    case 'ArrowDown':
      next = at < 0 ? n - 1 : clamp(at - 1);
      break;
    case 'Home':
      next = 0;
      break;
    case 'End':
      next = n - 1;
      break;
    case 'PageUp':
      next = at < 0 ? 0 : clamp(at + page);
      break;
    default: // PageDown
      next = at < 0 ? n - 1 : clamp(at - page);
  }
  return { kind: 'select', caseIndex: order[next].caseIndex };
}

/**
 * "Case 12, 3 of 7 on the front from the left: Gross lift-off mass 21,340 kg; Payload 450 kg."
 * The plotted quantities (axes, then colour) in the user's units.
 */
export function describeCase(
  c: PlotCase | undefined,
  caseIndex: number,
  position: number,
  total: number,
  keys: readonly string[],
  units: UnitSystem,
  canOpen: boolean
): string {
  const values = [...new Set(keys.filter(Boolean))].map((k) => `${metricInfo(k).label} ${fmtWithUnit(metricInfo(k).kind, c?.values[k], units)}`);
  return `Case ${caseIndex}, ${position} of ${total} on the front from the left: ${values.join('; ')}.${canOpen ? ' Enter opens it.' : ''}`;
}
