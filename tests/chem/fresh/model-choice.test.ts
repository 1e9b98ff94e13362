import { describe, expect, it } from 'vitest';
import {
  chooseModel,
  ionicStrengthFromSalinity,
  salinityFromIonicStrength,
} from '../../../src/chem/fresh/model-choice';
import {
  alkalinityFromFieldUnits,
  parseFreshInput,
  planIonicStrength,
} from '../../../src/chem/fresh/request';

describe('automatic model choice', () => {
  it('obeys an explicit choice', () => {
    expect(chooseModel('fresh', { salinity: 35, freshKeys: [] }).model).toBe('fresh');
  });
  it('chooses from salinity, then conductance, and names the basis', () => {
    expect(chooseModel('auto', { salinity: 35, freshKeys: [] }).model).toBe('saline');
    const d = chooseModel('auto', { salinityFromConductance: 0.25, freshKeys: [] });
    expect(d.model).toBe('fresh');
    expect(d.reason).toContain('specific conductance');
    expect(d.warnings).toEqual([]);
  });
  it('warns in the brackish band and names the model it chose', () => {
    const d = chooseModel('auto', { salinity: 3, freshKeys: [] });
    expect(d.model).toBe('saline');
    expect(d.warnings[0]?.code).toBe('brackish-water');
    expect(d.warnings[0]?.message).toContain('saline model was chosen');
    expect(chooseModel('auto', { salinity: 1, freshKeys: [] }).warnings[0]?.message).toContain(
      'fresh model was chosen',
    );
  });
  it('takes fresh-only inputs as evidence when nothing else is known', () => {
    expect(chooseModel('auto', { freshKeys: ['alkalinity_dkh'] }).model).toBe('fresh');
  });
  it('seawater ionic strength is 0.723 mol/kg at S 35 (DOE 1994 formula, memory) and inverts', () => {
    expect(ionicStrengthFromSalinity(35)).toBeCloseTo(0.723, 3);
    expect(salinityFromIonicStrength(ionicStrengthFromSalinity(12))).toBeCloseTo(12, 10);
  });
});

describe('fresh request', () => {
  it('prefers major ions over a given I, conductance and TDS', () => {
    const f = parseFreshInput({
      calcium_mg_l: 40,
      chloride_mg_l: 70,
      ionic_strength_mol_kg: 0.01,
      tds_mg_l: 300,
    });
    expect(planIonicStrength(f, undefined, 1e-3).method).toBe('major-ions');
    const g = parseFreshInput({ specific_conductance_us_cm: 500, tds_mg_l: 300 });
    expect(planIonicStrength(g, undefined, 1e-3)).toMatchObject({
      method: 'conductance-russell-1976',
      initial: 0.008,
    });
    expect(planIonicStrength(parseFreshInput({}), undefined, 1e-3).warnings[0]?.code).toBe(
      'ionic-strength-from-alkalinity',
    );
  });
  it('converts field alkalinity with the density and refuses two alkalinities', () => {
    const a = alkalinityFromFieldUnits({ alkalinity_mg_l_caco3: 100.0869 / 2 }, 1, false);
    expect(a?.umolKg).toBeCloseTo(1000, 8);
    expect(() => alkalinityFromFieldUnits({ alkalinity_dkh: 5, alkalinity_meq_l: 2 }, 1, false)).toThrow(
      /once/,
    );
    expect(() => alkalinityFromFieldUnits({ alkalinity_dkh: 5 }, 1, true)).toThrow(/once/);
  });
  it('refuses negative ions and unknown options with codes', () => {
    expect(() => parseFreshInput({ sodium_mg_l: -1 })).toThrow(/negative/);
    expect(() => parseFreshInput({ activity_model: 'pitzer' })).toThrow(/activity_model/);
  });
});
