/**
 * Keyboard stepping through the Pareto front: the order of the keys, the ends (no wrap), the
 * start from no selection, Escape, keys that are not the plot's, and the announcement in the
 * user's units (1 lb = 0.45359237 kg exactly, NIST SP 811 (2008) App. B.9).
 */
import { describe, expect, it } from 'vitest';
import { describeCase, frontOrder, stepFront } from '../../src/lib/components/pareto-nav';

// Given out of order on purpose. Left to right: 11, 12, 10, 13; bottom to top: 10, 12, 13, 11.
const pts = [
  { x: 3, y: 1, caseIndex: 10 },
  { x: 1, y: 5, caseIndex: 11 },
  { x: 2, y: 2, caseIndex: 12 },
  { x: 4, y: 4, caseIndex: 13 }
];
const to = (current: number | null, key: string) => {
  const r = stepFront(pts, current, key);
  return r.kind === 'select' ? r.caseIndex : r.kind;
};

describe('stepFront', () => {
  it('orders the front left to right, ties bottom to top', () => {
    expect(frontOrder(pts).map((p) => p.caseIndex)).toEqual([11, 12, 10, 13]);
    expect(frontOrder([{ x: 1, y: 2, caseIndex: 5 }, { x: 1, y: 1, caseIndex: 6 }]).map((p) => p.caseIndex)).toEqual([6, 5]);
  });

  it('starts at the low end with Right, Up, Home and PageUp, at the high end with the others', () => {
    expect(to(null, 'ArrowRight')).toBe(11);
    expect(to(null, 'Home')).toBe(11);
    expect(to(null, 'PageUp')).toBe(11);
    expect(to(null, 'ArrowLeft')).toBe(13);
    expect(to(null, 'End')).toBe(13);
    expect(to(null, 'PageDown')).toBe(13);
    expect(to(null, 'ArrowUp')).toBe(10);
    expect(to(null, 'ArrowDown')).toBe(11);
  });

  it('steps along x with Left/Right and along y with Up/Down', () => {
    expect(to(12, 'ArrowRight')).toBe(10);
    expect(to(10, 'ArrowRight')).toBe(13);
    expect(to(12, 'ArrowLeft')).toBe(11);
    expect(to(12, 'ArrowUp')).toBe(13);
    expect(to(13, 'ArrowUp')).toBe(11);
    expect(to(12, 'ArrowDown')).toBe(10);
    expect(to(10, 'Home')).toBe(11);
    expect(to(10, 'End')).toBe(13);
  });

  it('stops at the ends instead of wrapping', () => {
    expect(to(13, 'ArrowRight')).toBe(13);
    expect(to(11, 'ArrowLeft')).toBe(11);
    expect(to(11, 'ArrowUp')).toBe(11);
    expect(to(10, 'ArrowDown')).toBe(10);
  });

  it('moves a tenth of the front with PageUp/PageDown', () => {
    const many = Array.from({ length: 25 }, (_, i) => ({ x: i, y: 25 - i, caseIndex: 100 + i }));
    const r = (current: number, key: string) => (stepFront(many, current, key) as { caseIndex: number }).caseIndex;
    // round(25 / 10) = 3 points a page.
    expect(r(100, 'PageUp')).toBe(103);
    expect(r(110, 'PageDown')).toBe(107);
    expect(r(101, 'PageDown')).toBe(100);
    expect(r(123, 'PageUp')).toBe(124);
  });

  it('clears with Escape, and leaves other keys and an empty front alone', () => {
    expect(to(12, 'Escape')).toBe('clear');
    expect(to(null, 'Escape')).toBe('ignore');
    for (const key of ['Tab', 'a', ' ', 'Enter', 'Shift']) expect(to(12, key)).toBe('ignore');
    expect(stepFront([], null, 'ArrowRight').kind).toBe('ignore');
    // A selection that left the front (it changed while the sweep ran) still clears.
    expect(stepFront([], 12, 'Escape').kind).toBe('clear');
  });

  it('starts again from the end when the selected case is no longer on the front', () => {
    expect(to(99, 'ArrowRight')).toBe(11);
    expect(to(99, 'ArrowLeft')).toBe(13);
  });
});

describe('describeCase', () => {
  const c = { caseIndex: 7, feasible: true, paretoRank: 1, values: { glow: 10_000, payloadMass: 500, dryMass: null } };

  it('names the case, its place on the front and the plotted values with units', () => {
    expect(describeCase(c, 7, 2, 5, ['glow', 'payloadMass', ''], 'si', true)).toBe(
      'Case 7, 2 of 5 on the front from the left: Gross lift-off mass 10,000 kg; Payload 500 kg. Enter opens it.'
    );
  });

  it('speaks the user’s units, and a missing value as a dash', () => {
    // 10 000 kg = 22 046.2 lb; 500 kg = 1 102.3 lb.
    expect(describeCase(c, 7, 1, 1, ['glow', 'payloadMass', 'dryMass'], 'us', false)).toBe(
      'Case 7, 1 of 1 on the front from the left: Gross lift-off mass 22,046 lb; Payload 1,102 lb; Dry mass —.'
    );
  });
});
