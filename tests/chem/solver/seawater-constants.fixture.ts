/**
 * A fixed constant set for testing the solver on its own, independent of the formulations.
 * Values: S = 35, t = 25 °C, p = 0, total scale, from the check values in Dickson, Sabine &
 * Christian (2007), Guide to best practices for ocean CO2 measurements, chapter 5 (values from
 * memory, as listed in shared/docs/chemistry.md); totals from Lee et al. (2010) boron, Morris &
 * Riley (1966) sulfate, Riley (1965) fluoride, Riley & Tongudai (1967) calcium; NH4+ and H2S
 * p-values and the NBS offset are rough values from memory. The solver tests need a realistic
 * set, not an exact one: the formulations have their own tests.
 */

import type { ConstantSet } from '../../../src/chem/types';

const ks = Math.exp(-2.3);
const kf = Math.exp(-6.09);
const st = 0.02824;
const ft = 6.83e-5;

export const seawater25: ConstantSet = {
  model: 'saline',
  conditions: { temperatureC: 25, salinity: 35, pressureDbar: 0 },
  k0: Math.exp(-3.5617),
  fugacityFactor: 0.99676,
  k1: 10 ** -5.8472,
  k2: 10 ** -8.966,
  kw: Math.exp(-30.434),
  kb: Math.exp(-19.7964),
  ks,
  kf,
  k1p: Math.exp(-3.71),
  k2p: Math.exp(-13.727),
  k3p: Math.exp(-20.24),
  ksi: Math.exp(-21.61),
  knh4: 10 ** -9.26,
  kh2s: 10 ** -6.98,
  kspCalcite: 4.27e-7,
  kspAragonite: 6.48e-7,
  totalBoron: 4.326e-4,
  totalSulfate: st,
  totalFluoride: ft,
  calcium: 0.010287,
  freeHFactor: 1 / (1 + st / ks),
  scaleFactor: {
    total: 1,
    free: 1 / (1 + st / ks),
    seawater: (1 + st / ks + ft / kf) / (1 + st / ks),
    nbs: 10 ** -0.13,
  },
  formulations: { k1: 'test fixture' },
  warnings: [],
};

/** A fresh-water-like set (25 °C, I → 0): no sulfate, fluoride or boron; thermodynamic p-values. */
export const freshLike25: ConstantSet = {
  ...seawater25,
  model: 'fresh',
  conditions: { temperatureC: 25, salinity: 0, pressureDbar: 0 },
  k0: 10 ** -1.468,
  k1: 10 ** -6.352,
  k2: 10 ** -10.329,
  kw: 10 ** -13.995,
  totalBoron: 0,
  totalSulfate: 0,
  totalFluoride: 0,
  calcium: 0.001,
  kspCalcite: 10 ** -8.48,
  kspAragonite: 10 ** -8.336,
  freeHFactor: 1,
  scaleFactor: { total: 1, free: 1, seawater: 1, nbs: 1 },
};
