/**
 * Display helpers of result quantities. Conversion: NIST SP 811 App. B.8 (1 ft = 0.3048 m exactly).
 */
import { describe, expect, it } from 'vitest';
import { fmtFixed, fmtWithUnit } from '../../src/lib/components/quantities';

describe('fmtFixed (columns that add up, such as delta-v budget terms)', () => {
  it('shows whole m/s or ft/s with grouping, whatever the magnitude', () => {
    expect(['7612.64', '115.07', '-279.9', '0'].map((v) => fmtFixed('speed', Number(v), 'si'))).toEqual(['7,613', '115', '-280', '0']);
    // 7612.64 m/s / 0.3048 = 24,976.1 ft/s
    expect(fmtFixed('speed', 7612.64, 'us')).toBe('24,976');
    expect(fmtFixed('speed', 9.8, 'si', 1)).toBe('9.8');
    expect(fmtFixed('speed', null, 'si')).toBe('—');
  });

  it('differs from the significant-digit format used for single figures', () => {
    expect(fmtWithUnit('speed', 115.07, 'si')).toBe('115.1 m/s');
  });
});
