import { describe, expect, it } from 'vitest';
import { salineConstants } from '../../../src/chem/saline/constants';
import { alkalinityFromHDic } from '../../../src/chem/solver/alkalinity';
import { hFromTaDic, stateFromHDic } from '../../../src/chem/solver/pairs';
import type { MinorTotals } from '../../../src/chem/types';

const MINOR: MinorTotals = { phosphate: 2e-6, silicate: 20e-6, ammonia: 1e-6, sulfide: 0.5e-6 };

describe('saline constant sets drive the pair solver over the whole range', () => {
  it('TA–DIC converges with a tiny residual for t 0–40 °C, S 2–45, p 0–5000 dbar, both carbonic options', () => {
    for (const carbonic of ['lueker2000', 'millero2010'] as const)
      for (let t = 0; t <= 40; t += 10)
        for (const s of [2, 10, 25, 35, 45])
          for (const p of [0, 2000, 5000]) {
            const k = salineConstants({ temperatureC: t, salinity: s, pressureDbar: p }, { carbonic });
            // Alkalinity and DIC scaled with salinity, as in a river–sea mixing line.
            const ta = (2300e-6 * s) / 35 + 400e-6;
            const dic = (2000e-6 * s) / 35 + 380e-6;
            const h = hFromTaDic(ta, dic, k, MINOR);
            expect(Number.isFinite(h) && h > 0).toBe(true);
            expect(Math.abs(alkalinityFromHDic(h, dic, k, MINOR) - ta)).toBeLessThan(1e-12);
          }
  });

  it('the same water is more acid and less saturated at depth (pressure drives dissociation and solubility)', () => {
    const ta = 2350e-6;
    const dic = 2250e-6;
    const at = (p: number) => {
      const k = salineConstants({ temperatureC: 2, salinity: 34.7, pressureDbar: p });
      const st = stateFromHDic(hFromTaDic(ta, dic, k, MINOR), dic, k, MINOR);
      return { ph: -Math.log10(st.h), omega: (k.calcium * st.co3) / k.kspCalcite };
    };
    const surface = at(0);
    const deep = at(4000);
    expect(deep.ph).toBeLessThan(surface.ph);
    expect(deep.omega).toBeLessThan(surface.omega);
  });
});
