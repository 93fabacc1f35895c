/**
 * Display-unit conversions against NIST Special Publication 811 (2008 edition),
 * "Guide for the Use of the International System of Units (SI)", Appendix B.8 (factors
 * in alphabetical order) and B.9 (by kind of quantity). Exact factors are compared to
 * 1e-15 relative (double rounding only); the seven-digit factors printed in B.8 to half a
 * unit in their last printed digit.
 */
import { describe, expect, it } from 'vitest';
import {
  KG_PER_LB,
  M_PER_FT,
  M2_PER_FT2,
  M_PER_MI,
  N_PER_LBF,
  PA_PER_PSF,
  formatNumber,
  formatQuantity,
  fromDisplay,
  header,
  inputValue,
  parseNumber,
  parseQuantity,
  toDisplay,
  unitLabel,
  type Quantity
} from '../../src/lib/units';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('conversion factors (NIST SP 811, Appendix B)', () => {
  it('uses the exact definitions of the pound, foot, mile and pound-force', () => {
    // B.8: pound (avoirdupois) → kilogram 4.535 924 E−01, exact 0.453 592 37 (footnote).
    expect(KG_PER_LB).toBe(0.45359237);
    // B.8: foot → metre 3.048 E−01 (exact).
    expect(M_PER_FT).toBe(0.3048);
    // NIST SP 811 B.8: square foot → square metre 9.290304 E-02 (exact).
    expect(M2_PER_FT2).toBeCloseTo(0.09290304, 15);
    expect(toDisplay('area', 0.09290304, 'us')).toBeCloseTo(1, 12);
    expect(unitLabel('area', 'si')).toBe('m²');
    // B.8: mile (international) → metre 1.609 344 E+03 (exact).
    expect(M_PER_MI).toBe(1609.344);
    // B.8: pound-force → newton 4.448 222 E+00; exact value 4.448 221 615 260 5.
    expect(N_PER_LBF).toBe(4.4482216152605);
  });

  it('agrees with the definitions the factors come from', () => {
    // 1 lbf = 1 lb × standard acceleration of gravity g_n = 9.806 65 m/s² (exact, 3rd CGPM 1901).
    expect(rel(KG_PER_LB * 9.80665, N_PER_LBF)).toBeLessThan(1e-15);
    // 1 mi = 5280 ft (U.S. statute definition, NIST SP 811 B.6).
    expect(rel(5280 * M_PER_FT, M_PER_MI)).toBeLessThan(1e-15);
  });

  it('matches the seven-digit factors printed in Appendix B.8', () => {
    // pound-force per square foot → pascal 4.788 026 E+01
    expect(Math.abs(PA_PER_PSF - 47.88026)).toBeLessThan(0.5e-5);
    // kip (1000 lbf) → newton 4.448 222 E+03
    expect(Math.abs(fromDisplay('thrust', 1000, 'us') - 4448.222)).toBeLessThan(0.5e-3);
    // foot per second → metre per second 3.048 E−01 (exact)
    expect(fromDisplay('speed', 1, 'us')).toBe(0.3048);
    // B.9 inverse: 1 kg = 2.204 623 lb
    expect(Math.abs(toDisplay('mass', 1, 'us') - 2.204623)).toBeLessThan(0.5e-6);
    // 1 km = 0.621 371 2 mi (inverse of 1.609 344)
    expect(Math.abs(toDisplay('distance', 1000, 'us') - 0.6213712)).toBeLessThan(0.5e-7);
  });
});

describe('toDisplay / fromDisplay', () => {
  const quantities: Quantity[] = ['mass', 'force', 'thrust', 'length', 'altitude', 'distance', 'speed', 'pressure', 'isp'];

  it('round-trips every quantity in both systems to 1e-14 relative', () => {
    for (const q of quantities) {
      for (const system of ['si', 'us'] as const) {
        for (const v of [1e-3, 1, 287.5, 9.1e6]) {
          const back = fromDisplay(q, toDisplay(q, v, system), system);
          expect(rel(back, v), `${q} ${system} ${v}`).toBeLessThan(1e-14);
        }
      }
    }
  });

  it('shows SI thrust in kN, altitude and distance in km, pressure in kPa', () => {
    expect(toDisplay('thrust', 845_000, 'si')).toBe(845);
    expect(toDisplay('altitude', 500_000, 'si')).toBe(500);
    expect(toDisplay('pressure', 101_325, 'si')).toBeCloseTo(101.325, 12);
    expect(unitLabel('thrust', 'si')).toBe('kN');
  });

  it('shows US orbit altitudes in statute miles (NIST SP 811 B.8: 1 mi = 1 609.344 m exactly)', () => {
    // 500 km / 1.609344 km = 310.686 mi
    expect(unitLabel('altitude', 'us')).toBe('mi');
    expect(toDisplay('altitude', 500_000, 'us')).toBeCloseTo(310.686, 3);
  });

  it('leaves specific impulse in seconds in both systems', () => {
    expect(toDisplay('isp', 311, 'us')).toBe(311);
    expect(unitLabel('isp', 'us')).toBe('s');
  });

  it('converts a typical engine to US units', () => {
    // 1 000 000 N / 4.4482216152605 = 224 808.94 lbf; 1 500 kg / 0.45359237 = 3 306.93 lb
    expect(toDisplay('thrust', 1e6, 'us')).toBeCloseTo(224_808.943, 3);
    expect(toDisplay('mass', 1500, 'us')).toBeCloseTo(3306.934, 3);
  });
});

describe('formatting', () => {
  it('groups thousands, keeps four significant digits and shows whole large numbers whole', () => {
    expect(formatNumber(845_300)).toBe('845,300');
    expect(formatNumber(312.46)).toBe('312.5');
    expect(formatNumber(0.001234)).toBe('0.001234');
    expect(formatNumber(0)).toBe('0');
    expect(formatNumber(-42.125, { decimals: 1 })).toBe('-42.1');
  });

  it('shows a dash for missing values', () => {
    expect(formatNumber(null)).toBe('—');
    expect(formatNumber(Number.NaN)).toBe('—');
    expect(formatQuantity('mass', undefined, 'si')).toBe('—');
  });

  it('adds the unit of the chosen system', () => {
    expect(formatQuantity('thrust', 845_000, 'si')).toBe('845 kN');
    expect(formatQuantity('mass', 1000, 'us')).toBe('2,205 lb');
    expect(formatQuantity('thrust', 4448.2216152605, 'us', { unit: false })).toBe('1,000');
    expect(header('Thrust', 'thrust', 'us')).toBe('Thrust (lbf)');
  });

  it('gives form inputs a plain number that parses back', () => {
    const text = inputValue('mass', 1000, 'us');
    expect(text).toBe('2204.623');
    const back = parseQuantity('mass', text, 'us');
    expect(back.ok && rel(back.value, 1000)).toBeLessThan(1e-6);
    expect(inputValue('mass', null, 'us')).toBe('');
  });
});

describe('parsing form input', () => {
  it('accepts plain, grouped and exponent forms', () => {
    expect(parseNumber('1234.5')).toEqual({ ok: true, value: 1234.5 });
    expect(parseNumber(' 1,234,567.5 ')).toEqual({ ok: true, value: 1234567.5 });
    expect(parseNumber('1.2e6')).toEqual({ ok: true, value: 1.2e6 });
    expect(parseNumber('-.5')).toEqual({ ok: true, value: -0.5 });
    expect(parseNumber('845 000')).toEqual({ ok: true, value: 845000 });
  });

  it('refuses what is not a number, naming the field', () => {
    expect(parseNumber('', 'Thrust')).toEqual({ ok: false, error: 'Thrust is required' });
    expect(parseNumber('abc', 'Thrust')).toEqual({ ok: false, error: 'Thrust must be a number' });
    // "1,5" could mean 1.5 or 15: refused rather than guessed.
    expect(parseNumber('1,5', 'Mass').ok).toBe(false);
    expect(parseNumber('12kg', 'Mass').ok).toBe(false);
    expect(parseNumber('1e999', 'Mass')).toEqual({ ok: false, error: 'Mass must be a finite number' });
    expect(parseNumber(undefined, 'Mass').ok).toBe(false);
  });

  it('returns SI from a value typed in the user\'s unit', () => {
    const r = parseQuantity('thrust', '200,000', 'us', 'Thrust');
    expect(r.ok).toBe(true);
    if (r.ok) expect(rel(r.value, 200_000 * 4.4482216152605)).toBeLessThan(1e-15);
    const s = parseQuantity('thrust', '95', 'si', 'Thrust');
    expect(s).toEqual({ ok: true, value: 95_000 });
  });
});
