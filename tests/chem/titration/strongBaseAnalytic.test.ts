/**
 * An exact check independent of the carbonate model: a carbonate-free strong base titrated with a
 * strong acid. The pH of every point comes from the closed-form charge balance
 *   [H+] − Kw/[H+] = ([Cl-] − [Na+]),  [Na+] = Cb·V0/(V0+V), [Cl-] = C·V/(V0+V),
 * (any analytical chemistry text; activity = concentration at this dilution, Kw = 1e-14 at 25 °C
 * as conventionally rounded), so the equivalence volume is exactly Cb·V0/C.
 */

import { describe, expect, it } from 'vitest';
import { reduceTitration } from '../../../src/chem/titration/reduceTitration';
import type { TitrationInput } from '../../../src/chem/titration/types';
import { constantsAt25 } from './constantsFixture';

const V0 = 50;
const CB = 1.0e-3;
const C = 0.02;
const KW = 1e-14;
const VE = (CB * V0) / C; // 2.5 mL

function exactTitration(): TitrationInput {
  const points = [];
  for (let i = 0; i <= 50; i++) {
    const v = i * 0.1;
    const d = (C * v - CB * V0) / (V0 + v);
    const h = (d + Math.sqrt(d * d + 4 * KW)) / 2;
    points.push({ volume_ml: v, ph: -Math.log10(h) });
  }
  return { sample_volume_ml: V0, titrant_normality: C, temperature_c: 25, ionic_strength_mol_kg: 0, points };
}

const k = { ...constantsAt25(), kw: KW };

describe('carbonate-free strong base, exact curve', () => {
  it('Gran finds the equivalence volume exactly', () => {
    const r = reduceTitration({ ...exactTitration(), method: 'gran' }, () => k);
    expect(r.equivalence_volume_ml).toBeCloseTo(VE, 6);
    expect(r.alkalinity_meq_l).toBeCloseTo(1.0, 6);
    expect(r.fit.r2).toBeGreaterThan(0.999999);
    // Slope of F1 is γH·C = C at zero ionic strength.
    expect(r.fit.details.slope).toBeCloseTo(C * 1e-3 * 1e3, 8);
  });
  it('the inflection lies at the equivalence volume within a tenth of a step', () => {
    const r = reduceTitration({ ...exactTitration(), method: 'inflection' }, () => k);
    expect(Math.abs(r.equivalence_volume_ml - VE)).toBeLessThan(0.01);
  });
  it('the split is all hydroxide', () => {
    const r = reduceTitration({ ...exactTitration(), method: 'gran' }, () => k);
    expect(r.species.oh_mmol_l).toBeCloseTo(1.0, 4);
    expect(Math.abs(r.species.hco3_mmol_l)).toBeLessThan(1e-3);
  });
});
