import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { formatNumber } from '../../src/io/numbers';

describe('formatNumber', () => {
  it('writes every double as String(Number(v.toPrecision(12))) does, only faster', () => {
    const reference = (v: number) => String(Number(v.toPrecision(12)));
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (v) => {
        expect(formatNumber(v)).toBe(reference(v));
      }),
      { numRuns: 5000 },
    );
    for (const v of [
      0,
      -0,
      1e-7,
      1e-6,
      1e12,
      1e21,
      123456789012345,
      -2.5,
      9.000000000000002,
      0.1 + 0.2,
      5e-324,
    ])
      expect(formatNumber(v)).toBe(reference(v));
    expect(formatNumber(Number.NaN)).toBe('');
    expect(formatNumber(undefined)).toBe('');
  });
});
