import { describe, expect, it } from 'vitest';
import {
  conductivityAtTemperature,
  conductivityFromSalinity,
  salinityFromConductivity,
  salinityFromSpecificConductance,
  specificConductanceAt25,
  specificConductanceFromSalinity,
} from '../../../src/chem/seawater/conductance';
import { densityEos80, eos80Validity, secantBulkModulusEos80 } from '../../../src/chem/seawater/eos80';
import {
  conductivityRatioPss78,
  pss78Validity,
  rtPss78,
  salinityPss78,
} from '../../../src/chem/seawater/pss78';
import {
  salinityFromDensity,
  salinityFromSpecificGravity,
  specificGravityFromSalinity,
} from '../../../src/chem/seawater/specific-gravity';
import { EOS80_BULK_MODULUS_ROWS, EOS80_DENSITY_ROWS, PSS78_ROWS } from '../../fixtures/unesco-1983';

describe('EOS-80 against UNESCO (1983) check values', () => {
  it.each(EOS80_DENSITY_ROWS)('ρ(S $s, t $t68, p $pBar bar) = $rho', (row) => {
    expect(Math.abs(densityEos80(row.s, row.t68, row.pBar) - row.rho)).toBeLessThan(row.tol);
  });
  it.each(EOS80_BULK_MODULUS_ROWS)('K(S $s, t $t68, p $pBar bar) = $k', (row) => {
    expect(Math.abs(secantBulkModulusEos80(row.s, row.t68, row.pBar) - row.k)).toBeLessThan(row.tol);
  });
  it('warns outside its range', () => {
    expect(eos80Validity(45, 10, 0).map((w) => w.field)).toEqual(['salinity']);
    expect(eos80Validity(35, 10, 0)).toEqual([]);
  });
});

describe('PSS-78 against UNESCO (1983) check values', () => {
  it.each(PSS78_ROWS)('S(R $r, t $t68, p $pDbar) = $s', (row) => {
    expect(Math.abs(salinityPss78(row.r, row.t68, row.pDbar) - row.s)).toBeLessThan(row.tol);
  });
  it('inverse gives R = 1.888091 at S 40, 40 °C, 10000 dbar (UNESCO 1983)', () => {
    expect(conductivityRatioPss78(40, 40, 10000)).toBeCloseTo(1.888091, 5);
  });
  it('rt(15) = 1 by definition of the scale', () => {
    expect(rtPss78(15)).toBeCloseTo(1, 6);
  });
  it('round-trips salinity ↔ ratio over 0.01–42 and −2–35 °C, residual below 1e-8', () => {
    for (const s of [0.01, 0.2, 1, 1.999, 2.001, 5, 20, 35, 42]) {
      for (const t of [-2, 0, 10, 25, 35]) {
        for (const p of [0, 2000]) {
          const r = conductivityRatioPss78(s, t, p);
          expect(Math.abs(salinityPss78(r, t, p) - s)).toBeLessThan(1e-8);
        }
      }
    }
  });
  it('Hill et al. (1986) extension goes to S = 0 at R = 0 and is continuous with PSS-78 at S 2', () => {
    expect(salinityPss78(1e-12, 20, 0)).toBeLessThan(1e-6);
    const r2 = conductivityRatioPss78(2, 20, 0);
    // The published extension is applied below S 2 only; its terms leave a step < 1e-4 at the handover.
    expect(Math.abs(salinityPss78(r2 * (1 - 1e-9), 20, 0) - 2)).toBeLessThan(1e-4);
    expect(pss78Validity(1, 20, 0)[0]?.code).toBe('pss78-low-salinity-extension');
  });
});

describe('conductance', () => {
  it('S 35 seawater has a specific conductance near 53 mS/cm (common practice figure)', () => {
    expect(specificConductanceFromSalinity(35) / 1000).toBeCloseTo(53.0, 0);
  });
  it('round-trips specific conductance ↔ salinity', () => {
    for (const sc of [50, 500, 5000, 50000]) {
      expect(specificConductanceFromSalinity(salinityFromSpecificConductance(sc))).toBeCloseTo(sc, 6);
    }
    expect(salinityFromConductivity(conductivityFromSalinity(30, 12), 12)).toBeCloseTo(30, 8);
  });
  it('linear compensation (2 %/°C, common practice) and its inverse', () => {
    expect(specificConductanceAt25(400, 15)).toBeCloseTo(500, 10);
    expect(conductivityAtTemperature(500, 15)).toBeCloseTo(400, 10);
  });
  it('PSS-78 compensation of seawater agrees with the PSS-78 conductivity at 25 °C', () => {
    const c20 = conductivityFromSalinity(35, 20);
    expect(specificConductanceAt25(c20, 20, 'pss78')).toBeCloseTo(specificConductanceFromSalinity(35), 6);
    expect(conductivityAtTemperature(specificConductanceFromSalinity(35), 20, 'pss78')).toBeCloseTo(c20, 6);
  });
  it('rejects negative conductance with a code', () => {
    expect(() => specificConductanceAt25(-1, 20)).toThrow(/Conductivity/);
  });
});

describe('specific gravity and density', () => {
  it('S 35 reads SG 1.0264 at 25/25 °C (reef-keeping common practice)', () => {
    expect(specificGravityFromSalinity(35, 25, 25)).toBeCloseTo(1.0264, 4);
  });
  it('round-trips salinity ↔ SG and ↔ density', () => {
    for (const s of [0, 5, 20, 35, 40]) {
      expect(salinityFromSpecificGravity(specificGravityFromSalinity(s, 24, 15.56), 24, 15.56)).toBeCloseTo(
        s,
        7,
      );
      expect(salinityFromDensity(densityEos80(s, 1.00024 * 10, 0), 10)).toBeCloseTo(s, 7);
    }
  });
  it('the reference temperature matters: 60/60 °F hydrometers read higher than 25/25 °C', () => {
    expect(specificGravityFromSalinity(35, 15.56, 15.56)).toBeGreaterThan(
      specificGravityFromSalinity(35, 25, 25),
    );
  });
  it('rejects densities lighter than pure water', () => {
    expect(() => salinityFromDensity(990, 20)).toThrow(/lighter than pure water/);
  });
});
