/**
 * The catalogue entry form: values typed in the user's units become SI (NIST SP 811 exact
 * factors), and each bad field gets its own message.
 */
import { describe, expect, it } from 'vitest';
import { readEntryForm, valuesOf } from '../../../src/lib/catalogue/form';

const fd = (o: Record<string, string>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(o)) f.set(k, v);
  return f;
};
const good = { name: 'Alder A-1', propellants: 'LOX/RP-1', ispSeaLevelS: '290', ispVacuumS: '320', thrust: '845', mass: '1,100', notes: '' };

describe('readEntryForm', () => {
  it('reads SI input with thrust in kN', () => {
    const r = readEntryForm(fd(good), 'si');
    expect(r.ok && r.entry).toEqual({ name: 'Alder A-1', propellants: 'LOX/RP-1', ispSeaLevelS: 290, ispVacuumS: 320, thrustVacuumN: 845_000, massKg: 1100, notes: '' });
  });

  it('reads US input in lbf and lb', () => {
    const r = readEntryForm(fd({ ...good, thrust: '190,000', mass: '2425' }), 'us');
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.entry.thrustVacuumN).toBeCloseTo(190_000 * 4.4482216152605, 6);
      expect(r.entry.massKg).toBeCloseTo(2425 * 0.45359237, 9);
    }
  });

  it('treats a blank sea-level Isp as a vacuum-only engine', () => {
    const r = readEntryForm(fd({ ...good, ispSeaLevelS: ' ' }), 'si');
    expect(r.ok && r.entry.ispSeaLevelS).toBeNull();
  });

  it('names every bad field and keeps what was typed', () => {
    const r = readEntryForm(fd({ name: '', propellants: 'LOX/RP-1', ispSeaLevelS: '350', ispVacuumS: '320', thrust: 'lots', mass: '-3', notes: '' }), 'us');
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors).toEqual({
        name: 'Name is required',
        ispSeaLevelS: 'Sea-level Isp must be below vacuum Isp',
        thrust: 'Vacuum thrust must be a number',
        mass: 'Engine mass must be greater than zero'
      });
      expect(r.values.thrust).toBe('lots');
    }
    const r2 = readEntryForm(fd({ ...good, ispSeaLevelS: '350' }), 'si');
    expect(!r2.ok && r2.errors).toEqual({ ispSeaLevelS: 'Sea-level Isp must be below vacuum Isp' });
  });

  it('shows a stored entry back in the user units, and that reads back to the same SI values', () => {
    const e = { id: 1, workspaceId: 'w', createdAt: '', updatedAt: '', name: 'A', propellants: 'LOX/RP-1', ispSeaLevelS: null, ispVacuumS: 336, thrustVacuumN: 31_000, massKg: 64, notes: 'n' };
    const v = valuesOf(e, 'us');
    // 31 000 N / 4.4482216152605 N/lbf = 6969.0774… lbf, seven significant digits in the input.
    expect(v.thrust).toBe('6969.077');
    const back = readEntryForm(fd(v), 'us');
    expect(back.ok && Math.abs(back.entry.thrustVacuumN - 31_000)).toBeLessThan(1e-2);
    expect(back.ok && back.entry.ispSeaLevelS).toBeNull();
  });
});
