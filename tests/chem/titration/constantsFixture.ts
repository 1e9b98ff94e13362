/**
 * A fresh-water constant set at 25 °C and zero ionic strength for titration tests, from values
 * written down from memory: Plummer & Busenberg (1982) log K1 −6.352, log K2 −10.329,
 * log KH −1.468 (as listed in chemistry.md, *memory*); Kw 10^−13.995 (Harned & Owen 1958, *memory*).
 * Synthetic titrations are generated and reduced with the same set, so the tests check the
 * reduction, not these numbers.
 */

import type { ConstantSet } from '../../../src/chem/types';

export function constantsAt25(): ConstantSet {
  return {
    model: 'fresh',
    conditions: { temperatureC: 25, salinity: 0, pressureDbar: 0 },
    k0: 10 ** -1.468,
    fugacityFactor: 1,
    k1: 10 ** -6.352,
    k2: 10 ** -10.329,
    kw: 10 ** -13.995,
    kb: 10 ** -9.24,
    ks: 10 ** -1.99,
    kf: 10 ** -3.18,
    k1p: 10 ** -2.15,
    k2p: 10 ** -7.2,
    k3p: 10 ** -12.35,
    ksi: 10 ** -9.83,
    knh4: 10 ** -9.24,
    kh2s: 10 ** -6.99,
    kspCalcite: 10 ** -8.48,
    kspAragonite: 10 ** -8.336,
    totalBoron: 0,
    totalSulfate: 0,
    totalFluoride: 0,
    calcium: 0,
    freeHFactor: 1,
    scaleFactor: { total: 1, free: 1, seawater: 1, nbs: 1 },
    formulations: { k1: 'test fixture (memory values)' },
    warnings: [],
  };
}
