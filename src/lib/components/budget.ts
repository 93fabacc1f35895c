/**
 * The delta-v budget of one evaluated case as ordered lines with their origin, from whatever
 * the evaluator returned: explicit terms (`detail.budget.terms` / `budget.terms`, each with
 * `origin`) when present, else the flat result values, with the origin told from the mode and
 * the spec (orbital terms are computed; losses are allowances in budget mode — the user's own
 * or the loss correlation's — and simulated in ascent mode).
 */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Any = any;

export type TermOrigin = 'computed' | 'allowance' | 'correlation' | 'simulated';

export interface BudgetLine {
  key: string;
  label: string;
  /** Signed contribution [m/s]: the rotation assist is negative. */
  value: number;
  origin: TermOrigin | string;
  note: string;
}

const ORDER: { key: string; alt: string[]; label: string; loss?: 'gravity' | 'drag' | 'steering' }[] = [
  { key: 'insertionSpeed', alt: [], label: 'Insertion speed' },
  { key: 'gravityLoss', alt: [], label: 'Gravity loss', loss: 'gravity' },
  { key: 'dragLoss', alt: [], label: 'Drag loss', loss: 'drag' },
  { key: 'steeringLoss', alt: [], label: 'Steering loss', loss: 'steering' },
  { key: 'rotationAssist', alt: [], label: 'Earth-rotation assist' },
  { key: 'transferDeltaV', alt: ['transfer'], label: 'Transfer' },
  { key: 'planeChangeDeltaV', alt: ['planeChange'], label: 'Plane change' },
  { key: 'reserveDeltaV', alt: ['reserve'], label: 'Reserve' }
];

export function budgetLines(result: Any, spec: Any): BudgetLine[] {
  const b = result?.detail?.budget ?? result?.budget ?? null;
  const terms = b?.terms ?? (b && typeof b === 'object' ? b : null);
  const out: BudgetLine[] = [];
  for (const t of ORDER) {
    let raw: Any = null;
    if (terms) raw = [t.key, ...t.alt].map((k) => terms[k]).find((x) => x != null) ?? null;
    const v = raw != null ? (typeof raw === 'number' ? raw : raw.value) : [t.key, ...t.alt].map((k) => result?.values?.[k]).find((x) => typeof x === 'number');
    if (typeof v !== 'number' || !Number.isFinite(v)) continue;
    let origin: string = raw?.origin ?? 'computed';
    let note: string = raw?.note ?? '';
    if (!raw?.origin && t.loss) {
      if (spec?.mode === 'ascent') {
        origin = 'simulated';
        note = 'integrated over the simulated ascent';
      } else {
        origin = 'allowance';
        note = spec?.losses?.[t.loss] !== undefined ? 'your allowance' : 'loss correlation';
      }
    }
    if (!raw?.origin && !t.loss) note ||= t.key === 'reserveDeltaV' ? 'performance reserve' : 'orbital mechanics';
    const value = t.key === 'rotationAssist' ? -Math.abs(v) : v;
    if (value === 0 && (t.key === 'transferDeltaV' || t.key === 'planeChangeDeltaV' || t.key === 'reserveDeltaV')) {
      out.push({ key: t.key, label: t.label, value, origin, note });
      continue;
    }
    out.push({ key: t.key, label: t.label, value, origin, note });
  }
  return out;
}

export function budgetTotal(lines: BudgetLine[], result: Any): number {
  const t = result?.detail?.budget?.total;
  if (typeof t === 'number' && Number.isFinite(t)) return t;
  const v = result?.values?.requiredDeltaV;
  return typeof v === 'number' && Number.isFinite(v) ? v : lines.reduce((s, l) => s + l.value, 0);
}

export const ORIGIN_LABELS: Record<string, string> = {
  computed: 'computed',
  allowance: 'allowance',
  correlation: 'allowance (loss correlation)',
  simulated: 'simulated'
};
