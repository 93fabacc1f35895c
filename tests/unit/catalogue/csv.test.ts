/**
 * Catalogue CSV validation: header checks, per-row errors with spreadsheet row numbers and
 * column names, unit columns, and all-or-nothing (any error → no entries).
 * Expected lbf/lb conversions use the NIST SP 811 exact factors (4.4482216152605 N/lbf,
 * 0.45359237 kg/lb); the Isp bounds and "sea-level Isp below vacuum Isp" are common practice.
 */
import { describe, expect, it } from 'vitest';
import { CSV_MAX_ROWS, CSV_TEMPLATE, catalogueToCsv, describeRowError, parseCatalogueCsv } from '../../../src/lib/catalogue/csv';

const HEAD = 'name,propellants,isp_sl_s,isp_vac_s,thrust_n,mass_kg,notes';
const csv = (...rows: string[]) => [HEAD, ...rows].join('\n') + '\n';

describe('parseCatalogueCsv', () => {
  it('reads good rows into SI entries', () => {
    const r = parseCatalogueCsv(csv('Alder A-1,LOX/RP-1,290,320,850000,1100,GG cycle', 'Birch B-2,LOX/LH2,,450,100000,300,'));
    expect(r.errors).toEqual([]);
    expect(r.entries).toHaveLength(2);
    expect(r.rows).toEqual([2, 3]);
    expect(r.entries[0]).toEqual({
      name: 'Alder A-1',
      propellants: 'LOX/RP-1',
      ispSeaLevelS: 290,
      ispVacuumS: 320,
      thrustVacuumN: 850000,
      massKg: 1100,
      notes: 'GG cycle'
    });
    // Blank sea-level Isp: a vacuum-only engine.
    expect(r.entries[1].ispSeaLevelS).toBeNull();
  });

  it('accepts the template it offers for download', () => {
    const r = parseCatalogueCsv(CSV_TEMPLATE);
    expect(r.errors).toEqual([]);
    expect(r.entries).toHaveLength(1);
  });

  it('accepts columns in any order and case, quoted cells, a BOM and blank lines', () => {
    const text = '\uFEFFNOTES,Name,propellants,isp_vac_s,isp_sl_s,mass_kg,thrust_n\r\n"Cluster, 9 engines",Alder A-1,LOX/RP-1,320,290,1100,850000\r\n\r\n';
    const r = parseCatalogueCsv(text);
    expect(r.errors).toEqual([]);
    expect(r.entries[0].notes).toBe('Cluster, 9 engines');
  });

  it('converts thrust_lbf and mass_lb to SI', () => {
    const r = parseCatalogueCsv('name,propellants,isp_sl_s,isp_vac_s,thrust_lbf,mass_lb\nAlder,LOX/RP-1,290,320,200000,2500\n');
    expect(r.errors).toEqual([]);
    expect(r.entries[0].thrustVacuumN).toBeCloseTo(200000 * 4.4482216152605, 6);
    expect(r.entries[0].massKg).toBeCloseTo(2500 * 0.45359237, 9);
  });

  it('refuses the whole file when one row is bad, naming the row and the column', () => {
    const r = parseCatalogueCsv(csv('Alder A-1,LOX/RP-1,290,320,850000,1100,', 'Birch B-2,LOX/LH2,,fast,100000,300,', 'Cedar C-3,LOX/CH4,300,340,200000,200,'));
    expect(r.entries).toEqual([]);
    expect(r.errors).toEqual([{ row: 3, field: 'isp_vac_s', message: 'Vacuum Isp must be a number' }]);
    expect(describeRowError(r.errors[0])).toBe('Row 3, isp_vac_s: Vacuum Isp must be a number');
  });

  it('keeps spreadsheet numbering across blank lines', () => {
    const r = parseCatalogueCsv(csv('Alder,LOX/RP-1,290,320,850000,1100,', '', 'Birch,LOX/RP-1,290,320,-5,1100,'));
    expect(r.errors).toEqual([{ row: 4, field: 'thrust_n', message: 'Vacuum thrust must be greater than zero' }]);
  });

  it('reports every problem of every row', () => {
    const r = parseCatalogueCsv(csv(',LOX/RP-1,290,320,850000,1100,', 'Birch,,900,320,850000,0,', 'Cedar,LOX/RP-1,330,320,850000,10,'));
    expect(r.errors).toEqual([
      { row: 2, field: 'name', message: 'Name is required' },
      { row: 3, field: 'propellants', message: 'Propellants are required (for example LOX/RP-1)' },
      { row: 3, field: 'isp_sl_s', message: 'Sea-level Isp must be between 50 and 600 s' },
      { row: 3, field: 'mass_kg', message: 'Engine mass must be greater than zero' },
      { row: 4, field: 'isp_sl_s', message: 'Sea-level Isp must be below vacuum Isp' }
    ]);
  });

  it('refuses a name used twice in the file, case-insensitively', () => {
    const r = parseCatalogueCsv(csv('Alder,LOX/RP-1,290,320,850000,1100,', 'ALDER,LOX/RP-1,290,320,850000,1100,'));
    expect(r.errors).toEqual([{ row: 3, field: 'name', message: 'Name "ALDER" is already used in row 2' }]);
  });

  it('refuses a row with the wrong number of cells', () => {
    const r = parseCatalogueCsv(csv('Alder,LOX/RP-1,290,320,850000'));
    expect(r.errors).toEqual([{ row: 2, field: '', message: 'Row has 5 cells; the header has 7' }]);
  });

  it('checks the header: missing, unknown, duplicate and unit columns', () => {
    expect(parseCatalogueCsv('name,propellants,isp_sl_s,thrust_n,mass_kg\nA,B,1,2,3\n').errors).toEqual([
      { row: 1, field: 'isp_vac_s', message: 'Missing column "isp_vac_s"' }
    ]);
    expect(parseCatalogueCsv(`${HEAD},colour\n`).errors[0]).toMatchObject({ row: 1, field: 'colour' });
    expect(parseCatalogueCsv(`${HEAD},name\n`).errors[0]).toMatchObject({ row: 1, field: 'name', message: 'Column "name" appears twice' });
    expect(parseCatalogueCsv('name,propellants,isp_sl_s,isp_vac_s,thrust_n,thrust_lbf,mass_kg\n').errors).toEqual([
      { row: 1, field: 'thrust_n', message: 'Give exactly one thrust column: thrust_n or thrust_lbf' }
    ]);
  });

  it('refuses empty, header-only, binary and oversized files as a whole', () => {
    expect(parseCatalogueCsv('').errors).toEqual([{ row: 0, field: '', message: 'The file is empty' }]);
    expect(parseCatalogueCsv(`${HEAD}\n`).errors[0].message).toBe('The file has a header but no entries');
    expect(parseCatalogueCsv('PK\u0003\u0004\u0000\u0000').errors[0].message).toBe('The file is not a text CSV file');
    const many = Array.from({ length: CSV_MAX_ROWS + 1 }, (_, i) => `E${i},LOX/RP-1,290,320,850000,1100,`);
    expect(parseCatalogueCsv(csv(...many)).errors[0].message).toContain(`at most ${CSV_MAX_ROWS}`);
  });
});

describe('catalogueToCsv', () => {
  it('writes the import format, quoting where needed, and reads back to the same entries', () => {
    const entries = [
      { name: 'Alder, "A"', propellants: 'LOX/RP-1', ispSeaLevelS: 290.5, ispVacuumS: 320, thrustVacuumN: 850123.25, massKg: 1100, notes: 'line one\nline two' },
      { name: 'Birch', propellants: 'LOX/LH2', ispSeaLevelS: null, ispVacuumS: 450, thrustVacuumN: 1e5, massKg: 300, notes: '' }
    ];
    const text = catalogueToCsv(entries);
    expect(text.split('\r\n')[0]).toBe('name,propellants,isp_sl_s,isp_vac_s,thrust_n,mass_kg,notes');
    const back = parseCatalogueCsv(text);
    expect(back.errors).toEqual([]);
    expect(back.entries).toEqual(entries);
  });
});
