/**
 * The budget lines shown by the case page and the waterfall: order, signs and origins.
 * The sum rule (total = insertion + losses − rotation assist + transfer + plane change +
 * reserve) is the delta-v budget of DESIGN.md §1; figures here are invented inputs.
 */
import { describe, expect, it } from 'vitest';
import { budgetLines, budgetTotal } from '../../src/lib/components/budget';

const values = {
  insertionSpeed: 7612.6,
  gravityLoss: 1500,
  dragLoss: 120,
  steeringLoss: 300,
  rotationAssist: 280,
  transferDeltaV: 0,
  planeChangeDeltaV: 0,
  reserveDeltaV: 50,
  requiredDeltaV: 7612.6 + 1500 + 120 + 300 - 280 + 50
};

describe('budgetLines', () => {
  it('orders the terms, makes the rotation assist negative and sums to the required delta-v', () => {
    const lines = budgetLines({ values }, { mode: 'budget', losses: { drag: 120 } });
    expect(lines.map((l) => l.key)).toEqual(['insertionSpeed', 'gravityLoss', 'dragLoss', 'steeringLoss', 'rotationAssist', 'transferDeltaV', 'planeChangeDeltaV', 'reserveDeltaV']);
    expect(lines.find((l) => l.key === 'rotationAssist')!.value).toBe(-280);
    const sum = lines.reduce((s, l) => s + l.value, 0);
    expect(sum).toBeCloseTo(values.requiredDeltaV, 9);
    expect(budgetTotal(lines, { values })).toBe(values.requiredDeltaV);
  });

  it('tells allowances (the user’s or the correlation’s) from computed terms in budget mode', () => {
    const lines = budgetLines({ values }, { mode: 'budget', losses: { drag: 120 } });
    const by = Object.fromEntries(lines.map((l) => [l.key, l]));
    expect(by.insertionSpeed.origin).toBe('computed');
    expect(by.gravityLoss).toMatchObject({ origin: 'allowance', note: 'loss correlation' });
    expect(by.dragLoss).toMatchObject({ origin: 'allowance', note: 'your allowance' });
  });

  it('marks the losses simulated in ascent mode, and prefers explicit terms with their own origin', () => {
    const ascent = budgetLines({ values }, { mode: 'ascent', losses: {} });
    expect(ascent.find((l) => l.key === 'gravityLoss')!.origin).toBe('simulated');
    const explicit = budgetLines(
      { values, detail: { budget: { terms: { gravityLoss: { value: 1400, origin: 'allowance', note: 'user allowance' } } } } },
      { mode: 'ascent' }
    );
    expect(explicit.find((l) => l.key === 'gravityLoss')).toMatchObject({ value: 1400, origin: 'allowance', note: 'user allowance' });
  });

  it('reads the sweep evaluator’s detail shape: terms on detail.budget, its total, the correlation origin', () => {
    const term = (value: number, origin: string) => ({ value, origin, note: '' });
    const detail = {
      budget: {
        insertionSpeed: term(7600, 'computed'),
        gravityLoss: term(1500, 'correlation'),
        dragLoss: term(100, 'correlation'),
        steeringLoss: term(300, 'allowance'),
        rotationAssist: term(-280, 'computed'),
        transfer: term(0, 'computed'),
        planeChange: term(0, 'computed'),
        reserve: term(50, 'computed'),
        total: 9270
      }
    };
    const lines = budgetLines({ values: {}, detail }, { mode: 'budget' });
    expect(lines).toHaveLength(8);
    expect(lines.find((l) => l.key === 'gravityLoss')!.origin).toBe('correlation');
    expect(lines.find((l) => l.key === 'rotationAssist')!.value).toBe(-280);
    expect(lines.find((l) => l.key === 'reserveDeltaV')!.value).toBe(50);
    expect(budgetTotal(lines, { values: {}, detail })).toBe(9270);
    expect(lines.reduce((s, l) => s + l.value, 0)).toBe(9270);
  });
});
