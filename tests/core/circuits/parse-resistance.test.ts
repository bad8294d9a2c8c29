import { describe, expect, it } from 'vitest';
import { parseResistance } from '../../../src/core/circuits';

describe('parseResistance', () => {
  it('parseResistance reads a bare number as SI (Pa·s/m³)', () => {
    expect(parseResistance('1.2e13')).toBe(1.2e13); // SI in, SI out (identity)
  });

  it('parseResistance converts 1 mbar/(µL/min) to 6e12 Pa·s/m³ (physics.md §5 [N])', () => {
    expect(parseResistance('1 mbar/(uL/min)')).toBeCloseTo(6e12, -1);
    expect(parseResistance('2 mbar/(µL/min)')).toBeCloseTo(1.2e13, -1); // 2 × 6e12
    expect(parseResistance('3e13 Pa·s/m³')).toBeCloseTo(3e13, -1);
  });

  it('parseResistance refuses unknown units and non-positive values with the accepted units named', () => {
    expect(() => parseResistance('2 bar')).toThrow(/mbar\/\(uL\/min\)/);
    expect(() => parseResistance('0')).toThrow(/positive/);
    expect(() => parseResistance('abc')).toThrow(/not a positive number/);
  });
});
