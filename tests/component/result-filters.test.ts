/**
 * The results table's filters → the cases API query, with display units converted to SI.
 * Conversion factors: NIST SP 811 (1 lb = 0.45359237 kg, 1 ft = 0.3048 m, both exact).
 */
import { describe, expect, it } from 'vitest';
import { filterQuery, type FilterContext } from '../../src/lib/components/result-filters';
import type { UnitSystem } from '../../src/lib/units';

const ctx = (units: UnitSystem): FilterContext => ({
  units,
  label: (id) => ({ glow: 'GLOW (lb)', maxAxialAcceleration: 'Max axial acceleration (ft/s²)', 'p:stages.0.structuralCoefficient': 'First-stage ε' })[id] ?? id,
  metricKind: (k) => (k === 'glow' ? 'mass' : k === 'maxAxialAcceleration' ? 'acceleration' : 'ratio'),
  param: (path) => (path === 'stages.1.propulsion' ? { choice: true } : path === 'stages.0.structuralCoefficient' ? { choice: false, kind: 'ratio' } : undefined)
});

describe('filterQuery', () => {
  it('turns ranges in US customary units into SI query bounds (NIST SP 811 factors)', () => {
    const { params, errors } = filterQuery(
      [
        { id: 'glow', value: { min: '10,000', max: '' } },
        { id: 'maxAxialAcceleration', value: { min: '', max: '100' } }
      ],
      ctx('us')
    );
    expect(errors).toEqual({});
    expect(params.map(([k]) => k)).toEqual(['min.glow', 'max.maxAxialAcceleration']);
    expect(Number(params[0][1])).toBeCloseTo(4535.9237, 6);
    expect(Number(params[1][1])).toBeCloseTo(30.48, 9);
  });

  it('maps the feasible and rank columns and parameter filters to their query keys', () => {
    const { params } = filterQuery(
      [
        { id: 'feasible', value: 'yes' },
        { id: 'paretoRank', value: '1' },
        { id: 'p:stages.1.propulsion', value: 'hx' },
        { id: 'p:stages.0.structuralCoefficient', value: { min: '0.07', max: '0.08' } }
      ],
      ctx('si')
    );
    expect(params).toEqual([
      ['feasible', '1'],
      ['rank', '1'],
      ['is.param.stages.1.propulsion', 'hx'],
      ['min.param.stages.0.structuralCoefficient', '0.07'],
      ['max.param.stages.0.structuralCoefficient', '0.08']
    ]);
  });

  it('names the field of a text that is not a number and leaves that end out', () => {
    const { params, errors } = filterQuery([{ id: 'glow', value: { min: 'ten', max: '20000' } }], ctx('si'));
    expect(errors).toEqual({ glow: 'GLOW (lb) from must be a number' });
    expect(params).toEqual([['max.glow', '20000']]);
  });
});
