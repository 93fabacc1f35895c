import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import {
  atmosphere,
  atmosphereInto,
  createAtmosphereState,
  USSA_R0,
  type AtmosphereState
} from '../../../src/lib/physics/atmosphere';

/** One printed cell: its value and the size of one unit in its last printed digit. */
interface Cell {
  value: number;
  unit: number;
  text: string;
}

function parseCell(text: string): Cell | null {
  const t = text.trim();
  if (t === '') return null;
  const [mantissa, exponent] = t.toLowerCase().split('e');
  const dot = mantissa.indexOf('.');
  const decimals = dot < 0 ? 0 : mantissa.length - dot - 1;
  const unit = 10 ** ((exponent ? Number(exponent) : 0) - decimals);
  return { value: Number(t), unit, text: t };
}

interface Row {
  line: number;
  altitude: number;
  temperature: Cell | null;
  pressure: Cell | null;
  density: Cell | null;
  speedOfSound: Cell | null;
}

const fixturePath = fileURLToPath(new URL('../../fixtures/ussa1976.csv', import.meta.url));
const rows: Row[] = readFileSync(fixturePath, 'utf8')
  .split('\n')
  .map((text, i) => ({ text, line: i + 1 }))
  .filter(({ text }) => text.trim() !== '' && !text.startsWith('#') && !text.startsWith('altitude'))
  .map(({ text, line }) => {
    const [z, t, p, rho, a] = text.split(',');
    return {
      line,
      altitude: Number(z),
      temperature: parseCell(t),
      pressure: parseCell(p),
      density: parseCell(rho),
      speedOfSound: parseCell(a)
    };
  });

describe('atmosphere() against the U.S. Standard Atmosphere 1976 table (tests/fixtures/ussa1976.csv, from memory)', () => {
  it('reads the whole table (a truncated fixture fails)', () => {
    expect(rows.length).toBe(26);
    // Every layer of the closed-form part (bases 0, 11, 20, 32, 47, 51, 71 km geopotential)
    // and the fitted part above 86 km has at least one row.
    const layerTops = [-1, 11_019, 20_063, 32_162, 47_350, 51_412, 71_802, 86_000, 1_000_000];
    for (let k = 0; k < layerTops.length - 1; k++) {
      const inLayer = rows.filter((r) => r.altitude > layerTops[k] && r.altitude <= layerTops[k + 1]);
      expect(inLayer.length, `rows in layer ${k}`).toBeGreaterThan(0);
    }
  });

  // Up to 86 km every cell is an independent check of the closed-form model. Above 86 km only
  // the temperature is (the standard's own eqs. 25–31 against its table); the pressure and
  // density rows there are the fit's nodes, so they check that the fit passes through them.
  for (const row of rows) {
    it(`row ${row.line}: ${row.altitude} m`, () => {
      const got = atmosphere(row.altitude);
      const fields: Array<[keyof AtmosphereState, Cell | null]> = [
        ['temperature', row.temperature],
        ['pressure', row.pressure],
        ['density', row.density],
        ['speedOfSound', row.speedOfSound]
      ];
      let checked = 0;
      for (const [name, cell] of fields) {
        if (!cell) continue;
        // Tolerance: one unit in the table's last printed digit — half a unit for the printed
        // rounding, half for the table's own rounding of its intermediate constants
        // (e.g. the table prints 295.069 m/s where eq. 50 gives 295.0696).
        const tol = cell.unit * (1 + 1e-9);
        const diff = Math.abs(got[name] - cell.value);
        expect(
          diff,
          `${fixturePath}:${row.line} ${name} at ${row.altitude} m: got ${got[name]}, table ${cell.text}, |diff| ${diff}, tol ${tol}`
        ).toBeLessThanOrEqual(tol);
        checked++;
      }
      expect(checked).toBeGreaterThan(0);
    });
  }
});

describe('atmosphere() input validation', () => {
  it.each([NaN, Infinity, -Infinity, -5000.001, -1e6])('rejects %s with a RangeError naming altitude', (h) => {
    expect(() => atmosphere(h)).toThrow(RangeError);
    expect(() => atmosphere(h)).toThrow(/altitude/);
    expect(() => atmosphereInto(h, createAtmosphereState())).toThrow(RangeError);
  });

  it('accepts the edges of its range: −5 km and above the 1,000 km fit top', () => {
    expect(atmosphere(-5000).density).toBeGreaterThan(1.9);
    const high = atmosphere(2_000_000);
    expect(Number.isFinite(high.density) && high.density > 0).toBe(true);
    expect(high.density).toBeLessThan(atmosphere(1_000_000).density);
  });
});

describe('atmosphere() continuity and shape', () => {
  // Geopotential layer bases of USSA 1976 Table 4, converted to geometric altitude (eq. 18 inverted).
  const hBoundaries = [11000, 20000, 32000, 47000, 51000, 71000];
  const zOf = (h: number) => (USSA_R0 * h) / (USSA_R0 - h);

  it.each(hBoundaries)('is continuous at the layer base H = %i m', (h) => {
    const z = zOf(h);
    const below = atmosphere(z - 1e-6);
    const above = atmosphere(z + 1e-6);
    // Base pressures are published to 7 significant digits: a jump larger than 1e-6 relative
    // would mean a wrong base value or a wrong layer index.
    expect(Math.abs(above.pressure / below.pressure - 1)).toBeLessThan(1e-6);
    expect(Math.abs(above.density / below.density - 1)).toBeLessThan(1e-6);
    expect(Math.abs(above.temperature - below.temperature)).toBeLessThan(1e-6);
  });

  it('joins the fitted upper part continuously at 86 km', () => {
    const below = atmosphere(86000 - 1e-6);
    const above = atmosphere(86000 + 1e-6);
    expect(Math.abs(above.pressure / below.pressure - 1)).toBeLessThan(1e-8);
    expect(Math.abs(above.density / below.density - 1)).toBeLessThan(1e-8);
    // Kinetic temperature: 186.8673 K from both the M/M0 ratio at 86 km and eq. 26 (USSA 1976).
    expect(Math.abs(above.temperature - below.temperature)).toBeLessThan(1e-3);
  });

  it('has density and pressure strictly falling from −5 km to 1,000 km (every 250 m)', () => {
    const s = createAtmosphereState();
    let prevRho = Infinity;
    let prevP = Infinity;
    let bad = '';
    for (let z = -5000; z <= 1_000_000; z += 250) {
      atmosphereInto(z, s);
      if (!(s.density < prevRho) || !(s.pressure < prevP)) bad ||= `at ${z} m`;
      prevRho = s.density;
      prevP = s.pressure;
    }
    expect(bad).toBe('');
  });

  it('atmosphereInto writes the same numbers as atmosphere and returns its argument', () => {
    const s = createAtmosphereState();
    for (const z of [0, 12345, 75000, 99000, 456789]) {
      const r = atmosphereInto(z, s);
      expect(r).toBe(s);
      expect({ ...s }).toEqual(atmosphere(z));
    }
  });
});
