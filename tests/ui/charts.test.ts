import { describe, expect, it } from 'vitest';
import { decimate, mergeSeries } from '../../src/ui/charts/chart-data';
import { fractionsAt } from '../../src/ui/charts/speciation';

describe('chart data', () => {
  it('merges series onto one ascending unique x axis with null gaps', () => {
    const m = mergeSeries([
      { t: [3, 1, 2], v: [30, 10, 20] },
      { t: [2, 4], v: [200, 400] },
    ]);
    expect([...m.xs]).toEqual([1, 2, 3, 4]);
    expect(m.ys).toEqual([
      [10, 20, 30, null],
      [null, 200, null, 400],
    ]);
  });
  it('turns NaN into gaps, not values', () => {
    expect(mergeSeries([{ t: [1, 2], v: [Number.NaN, 1] }]).ys[0]).toEqual([null, 1]);
  });
  it('decimates 100 000 points to a few per pixel and keeps the extremes', () => {
    const n = 100_000;
    const t = Float64Array.from({ length: n }, (_, i) => i);
    const v = Array.from({ length: n }, (_, i) => Math.sin(i / 500));
    v[54_321] = 99; // a spike must survive
    const d = decimate(mergeSeries([{ t, v }]), 800);
    expect(d.xs.length).toBeLessThanOrEqual(800 * 4 + 2);
    expect(d.xs.length).toBeGreaterThan(800);
    expect(Math.max(...(d.ys[0] as number[]))).toBe(99);
    expect(d.xs[0]).toBe(0);
    expect(d.xs[d.xs.length - 1]).toBe(n - 1);
    for (let i = 1; i < d.xs.length; i++) expect(d.xs[i]! > d.xs[i - 1]!).toBe(true);
  });
  it('decimates a zoomed window from the full data', () => {
    const t = Float64Array.from({ length: 10_000 }, (_, i) => i);
    const v = Array.from({ length: 10_000 }, (_, i) => i);
    const d = decimate(mergeSeries([{ t, v }]), 100, 2000, 2100);
    expect(d.xs[0]).toBe(1999);
    expect(d.xs[d.xs.length - 1]).toBe(2101);
    expect(d.xs.length).toBe(103);
  });
});

describe('speciation fractions', () => {
  it('sum to one and cross at pK1 and pK2', () => {
    const pk1 = 5.847;
    const pk2 = 8.966;
    for (const ph of [2, 5, 6.3, 8.1, 11, 14]) {
      const f = fractionsAt(ph, pk1, pk2);
      expect(f.co2 + f.hco3 + f.co3).toBeCloseTo(1, 12);
    }
    const a = fractionsAt(pk1, pk1, pk2);
    expect(a.co2).toBeCloseTo(a.hco3, 12);
    const b = fractionsAt(pk2, pk1, pk2);
    expect(b.hco3).toBeCloseTo(b.co3, 12);
  });
});
