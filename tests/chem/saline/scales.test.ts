import { describe, expect, it } from 'vitest';
import { salineConstants } from '../../../src/chem/saline/constants';
import { convertH, convertPh, salineScaleFactors } from '../../../src/chem/saline/scales';
import { PH_SCALES } from '../../../src/chem/types';

const PAIRS = PH_SCALES.flatMap((a) => PH_SCALES.map((b) => [a, b] as const));
const CONDITIONS = [
  { temperatureC: 25, salinity: 35, pressureDbar: 0 },
  { temperatureC: 2, salinity: 34.7, pressureDbar: 4000 },
  { temperatureC: 18, salinity: 12, pressureDbar: 0 },
];

describe.each(CONDITIONS)('pH scales at $temperatureC °C, S $salinity, $pressureDbar dbar', (cond) => {
  const set = salineConstants(cond);
  const f = set.scaleFactor;

  it('the internal scale is total, and freeHFactor is 1/(1 + ST/KS)', () => {
    expect(f.total).toBe(1);
    expect(set.freeHFactor).toBe(f.free);
    expect(set.freeHFactor).toBeCloseTo(1 / (1 + set.totalSulfate / set.ks), 15);
    expect(f.seawater).toBeCloseTo(
      (1 + set.totalSulfate / set.ks + set.totalFluoride / set.kf) / (1 + set.totalSulfate / set.ks),
      15,
    );
  });

  it('orders the concentration scales: [H+]free < [H+]total < [H+]seawater', () => {
    expect(f.free).toBeLessThan(1);
    expect(f.seawater).toBeGreaterThan(1);
  });

  it.each(PAIRS)('round trip %s → %s → back is exact to a few ulp', (a, b) => {
    for (const h of [1e-9, 8.1e-9, 3e-7]) {
      const back = convertH(convertH(h, a, b, f), b, a, f);
      expect(Math.abs(back / h - 1)).toBeLessThanOrEqual(4 * Number.EPSILON);
      const ph = -Math.log10(h);
      expect(Math.abs(convertPh(convertPh(ph, a, b, f), b, a, f) - ph)).toBeLessThanOrEqual(1e-14);
      expect(convertPh(ph, a, b, f)).toBeCloseTo(-Math.log10(convertH(h, a, b, f)), 13);
    }
  });
});

describe('sizes of the scale offsets', () => {
  const f = salineConstants({ temperatureC: 25, salinity: 35, pressureDbar: 0 }).scaleFactor;
  const ph = 8.0;
  it('pH free is about 0.11 above pH total in seawater (common practice, memory)', () => {
    expect(convertPh(ph, 'total', 'free', f) - ph).toBeCloseTo(0.11, 1);
  });
  it('pH seawater is about 0.01 below pH total (common practice, memory)', () => {
    expect(convertPh(ph, 'total', 'seawater', f) - ph).toBeCloseTo(-0.01, 2);
  });
  it('NBS-calibrated meters read roughly 0.1–0.2 above the total scale in seawater (common practice)', () => {
    const d = convertPh(ph, 'total', 'nbs', f) - ph;
    expect(d).toBeGreaterThan(0.05);
    expect(d).toBeLessThan(0.25);
  });
  it('without sulfate or fluoride the concentration scales coincide', () => {
    const g = salineScaleFactors(0, 0.1, 0, 0.002, 1);
    expect([g.total, g.free, g.seawater, g.nbs]).toEqual([1, 1, 1, 1]);
  });
});
