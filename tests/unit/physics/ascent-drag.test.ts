/**
 * Cd–Mach interpolation (src/lib/physics/drag.ts) and the tabulated atmosphere fast path
 * (src/lib/physics/atmosphere-table.ts) used by the ascent integrator.
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_DRAG_COEFFICIENT, cdAt, compileDragTable, dragCoefficient } from '../../../src/lib/physics/drag';
import { atmosphere, createAtmosphereState } from '../../../src/lib/physics/atmosphere';
import { ATMOSPHERE_TABLE_TOP, atmosphereTableInto } from '../../../src/lib/physics/atmosphere-table';

describe('dragCoefficient: piecewise-linear, held beyond the ends', () => {
  const table: [number, number][] = [[0.5, 0.3], [1, 0.5], [2, 0.4]];
  it('interpolates linearly between breakpoints (exact arithmetic cases)', () => {
    expect(dragCoefficient(table, 0.75)).toBeCloseTo(0.4, 14);
    expect(dragCoefficient(table, 1.5)).toBeCloseTo(0.45, 14);
    expect(dragCoefficient(table, 1)).toBe(0.5);
  });
  it('holds the end values beyond the table', () => {
    expect(dragCoefficient(table, 0)).toBe(0.3);
    expect(dragCoefficient(table, 9)).toBe(0.4);
  });
  it('a compiled table gives the same values as the raw array', () => {
    const t = compileDragTable(table);
    for (const m of [0, 0.2, 0.5, 0.9, 1.3, 2, 7]) expect(cdAt(t, m)).toBe(dragCoefficient(table, m));
  });
  it('a single point is a constant Cd', () => {
    expect(dragCoefficient([[1, 0.25]], 3)).toBe(0.25);
  });
  it('rejects malformed tables and Mach numbers, naming the field', () => {
    expect(() => compileDragTable([])).toThrow(/dragCoefficient/);
    expect(() => compileDragTable([[1, 0.3], [0.5, 0.2]])).toThrow(/dragCoefficient\[1\].*increasing/);
    expect(() => compileDragTable([[0, -0.1]])).toThrow(/dragCoefficient\[0\] Cd/);
    expect(() => compileDragTable([[Number.NaN, 0.1]])).toThrow(/dragCoefficient\[0\] Mach/);
    expect(() => dragCoefficient(table, -1)).toThrow(RangeError);
    expect(() => dragCoefficient(table, Number.NaN)).toThrow(/mach/);
  });
});

describe('DEFAULT_DRAG_COEFFICIENT shape (common practice for slender launchers, from memory)', () => {
  const t = compileDragTable(DEFAULT_DRAG_COEFFICIENT);
  it('subsonic Cd ≈ 0.2–0.3', () => {
    for (const m of [0, 0.3, 0.6, 0.8]) {
      expect(cdAt(t, m)).toBeGreaterThanOrEqual(0.2);
      expect(cdAt(t, m)).toBeLessThanOrEqual(0.3);
    }
  });
  it('transonic peak ≈ 0.5–0.6 between Mach 1.1 and 1.3', () => {
    let peakM = 0;
    let peak = 0;
    for (let m = 0; m <= 6; m += 0.01) if (cdAt(t, m) > peak) [peak, peakM] = [cdAt(t, m), m];
    expect(peak).toBeGreaterThanOrEqual(0.5);
    expect(peak).toBeLessThanOrEqual(0.6);
    expect(peakM).toBeGreaterThanOrEqual(1.1);
    expect(peakM).toBeLessThanOrEqual(1.3);
  });
  it('falls to ≈ 0.25 by Mach 4–5 and stays there', () => {
    expect(cdAt(t, 5)).toBeGreaterThanOrEqual(0.22);
    expect(cdAt(t, 5)).toBeLessThanOrEqual(0.28);
    expect(cdAt(t, 20)).toBe(cdAt(t, 5));
    for (let m = 1.3; m < 5; m += 0.1) expect(cdAt(t, m + 0.1)).toBeLessThanOrEqual(cdAt(t, m));
  });
});

describe('atmosphereTableInto vs atmosphere() (USSA 1976 via ./atmosphere)', () => {
  it('pressure and density within 3e-5 relative, speed of sound within 1e-3 m/s, −5 km to 300 km', () => {
    // Bound: linear interpolation of exp(−h/H) over Δ = 50 m errs by ≤ (Δ/H)²/8 ≈ 1e-5 for
    // H ≥ 5 km; 3e-5 leaves margin for the steeper thermosphere segments above 86 km.
    const s = createAtmosphereState();
    let worstP = 0;
    let worstRho = 0;
    let worstA = 0;
    let count = 0;
    for (let h = -5000; h < ATMOSPHERE_TABLE_TOP; h += 37.3) {
      const exact = atmosphere(h);
      atmosphereTableInto(h, s);
      worstP = Math.max(worstP, Math.abs(s.pressure / exact.pressure - 1));
      worstRho = Math.max(worstRho, Math.abs(s.density / exact.density - 1));
      worstA = Math.max(worstA, Math.abs(s.speedOfSound - exact.speedOfSound));
      count++;
    }
    expect(count).toBeGreaterThan(8000);
    expect(worstP, `worst pressure error ${worstP}`).toBeLessThan(3e-5);
    expect(worstRho, `worst density error ${worstRho}`).toBeLessThan(3e-5);
    expect(worstA, `worst speed-of-sound error ${worstA}`).toBeLessThan(1e-3);
  });
  it('is the exact model above the table top', () => {
    const s = createAtmosphereState();
    expect(atmosphereTableInto(400e3, s).density).toBe(atmosphere(400e3).density);
  });
});
