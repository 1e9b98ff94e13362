import { describe, expect, it } from 'vitest';
import {
  fugacityFactorWeiss1974,
  logK1PlummerBusenberg1982,
  logK1pBates1951,
  logK2PlummerBusenberg1982,
  logK2pBatesAcree1943,
  logKbDickson1990S0,
  logKhPlummerBusenberg1982,
  logKnh4BatesPinching1949,
  logKspAragonitePlummerBusenberg1982,
  logKspCalcitePlummerBusenberg1982,
  logKspDolomiteNordstrom1990,
  logKVantHoff,
  logKwHarnedOwen1958,
  PLUMMER_BUSENBERG_1982_RANGE_C,
} from '../../../src/chem/fresh/thermo';
import { rangeWarning } from '../../../src/chem/fresh/validity';
import { PKW_HARNED_OWEN_1958 } from '../../fixtures/harned-owen-1958';
import { OTHER_PK_25C, PLUMMER_BUSENBERG_1982_ROWS } from '../../fixtures/plummer-busenberg-1982';

const K = 273.15;
const byQuantity = {
  k1: logK1PlummerBusenberg1982,
  k2: logK2PlummerBusenberg1982,
  kh: logKhPlummerBusenberg1982,
  calcite: logKspCalcitePlummerBusenberg1982,
  aragonite: logKspAragonitePlummerBusenberg1982,
} as const;
const otherByQuantity = {
  kw: logKwHarnedOwen1958,
  kb: logKbDickson1990S0,
  knh4: logKnh4BatesPinching1949,
  k1p: logK1pBates1951,
  k2p: logK2pBatesAcree1943,
} as const;

describe('Plummer & Busenberg (1982) carbonate constants', () => {
  it.each(PLUMMER_BUSENBERG_1982_ROWS)('$quantity at $tC °C ($source): log K $logK', (row) => {
    expect(Math.abs(byQuantity[row.quantity](row.tC + K) - row.logK)).toBeLessThan(row.tol);
  });

  it('moves in the published direction with temperature', () => {
    // K2 rises and the solubilities of CO2 and calcite fall with warming (PB82 Figs. 2–6).
    expect(logK2PlummerBusenberg1982(283.15)).toBeLessThan(logK2PlummerBusenberg1982(308.15));
    expect(logKhPlummerBusenberg1982(283.15)).toBeGreaterThan(logKhPlummerBusenberg1982(308.15));
    expect(logKspCalcitePlummerBusenberg1982(283.15)).toBeGreaterThan(
      logKspCalcitePlummerBusenberg1982(308.15),
    );
    // K1 passes through a maximum near 50 °C (Harned & Davis 1943).
    const k1 = [25, 45, 50, 55, 75].map((t) => logK1PlummerBusenberg1982(t + K));
    expect(k1[2]!).toBeGreaterThan(k1[0]!);
    expect(k1[2]!).toBeGreaterThan(k1[4]!);
  });

  it('aragonite is more soluble than calcite at every temperature', () => {
    for (let t = 0; t <= 90; t += 10) {
      expect(logKspAragonitePlummerBusenberg1982(t + K)).toBeGreaterThan(
        logKspCalcitePlummerBusenberg1982(t + K),
      );
    }
  });

  it('warns outside 0–90 °C and stays silent inside', () => {
    expect(rangeWarning('PB82', 'temperature', 95, PLUMMER_BUSENBERG_1982_RANGE_C, '°C')?.code).toBe(
      'formulation-out-of-range',
    );
    expect(rangeWarning('PB82', 'temperature', 25, PLUMMER_BUSENBERG_1982_RANGE_C, '°C')).toBeUndefined();
  });
});

describe('other thermodynamic constants at 25 °C', () => {
  it.each(OTHER_PK_25C)('$quantity ($source): pK $pK', (row) => {
    expect(Math.abs(-otherByQuantity[row.quantity](298.15) - row.pK)).toBeLessThan(row.tol);
  });

  it('dolomite (Nordstrom et al. 1990, memory) is −17.09 at 25 °C and less soluble when warm (ΔH < 0)', () => {
    expect(logKspDolomiteNordstrom1990(298.15)).toBeCloseTo(-17.09, 10);
    expect(logKspDolomiteNordstrom1990(298.15, 'disordered')).toBeCloseTo(-16.54, 10);
    expect(logKspDolomiteNordstrom1990(313.15)).toBeLessThan(-17.09);
  });

  it('van t Hoff: d log K / d(1/T) = −ΔH/(R ln 10)', () => {
    const dH = 20000;
    const t1 = 290;
    const t2 = 310;
    const slope = (logKVantHoff(-5, dH, t2) - logKVantHoff(-5, dH, t1)) / (1 / t2 - 1 / t1);
    expect(slope).toBeCloseTo(-dH / (8.314462618 * Math.LN10), 6);
  });

  it('Weiss (1974) fugacity factor is 0.9968 at 25 °C and 1 atm (Dickson et al. 2007 ch. 5, memory)', () => {
    expect(fugacityFactorWeiss1974(298.15)).toBeCloseTo(0.9968, 4);
  });
});

describe('Harned & Owen (1958) Kw fit against its own table (issue 12 §4)', () => {
  it('sits 0.0003–0.0028 low in pKw over 0–60 °C, mean 0.0017, as the doc comment says', () => {
    const residuals = PKW_HARNED_OWEN_1958.map(
      (row) => -logKwHarnedOwen1958(row.tC + 273.15) - row.pKw, // pKw(fit) − pKw(table)
    );
    for (const r of residuals) {
      expect(r).toBeLessThan(0);
      expect(r).toBeGreaterThan(-0.003);
    }
    const mean = residuals.reduce((a, b) => a + b, 0) / residuals.length;
    expect(mean).toBeCloseTo(-0.0017, 3);
  });
});
