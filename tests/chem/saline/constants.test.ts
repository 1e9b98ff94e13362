import { describe, expect, expectTypeOf, it } from 'vitest';
import { TufaError } from '../../../src/chem/errors';
import { T0_K } from '../../../src/chem/physical';
import { knh4CleggWhitfield1995 } from '../../../src/chem/saline/ammonium';
import { kbDickson1990b } from '../../../src/chem/saline/boric';
import { kspAragoniteMucci1983, kspCalciteMucci1983 } from '../../../src/chem/saline/calcium-carbonate';
import { k1Lueker2000, k1Millero2010, k2Lueker2000, k2Millero2010 } from '../../../src/chem/saline/carbonic';
import { fugacityFactorWeiss1974, k0Weiss1974 } from '../../../src/chem/saline/co2-solubility';
import { type SalineOptions, salineConstants } from '../../../src/chem/saline/constants';
import { kfDicksonRiley1979, kfPerezFraga1987 } from '../../../src/chem/saline/fluoride';
import {
  CALCIUM_INVALID,
  CONDITION_NOT_FINITE,
  CONDITION_OUT_OF_RANGE,
  OPTION_UNKNOWN,
} from '../../../src/chem/saline/issues';
import { k1pMillero1995, k2pMillero1995, k3pMillero1995 } from '../../../src/chem/saline/phosphoric';
import { ksiMillero1995 } from '../../../src/chem/saline/silicic';
import { ksDickson1990a } from '../../../src/chem/saline/sulfate';
import { kh2sMillero1988 } from '../../../src/chem/saline/sulfide';
import {
  calciumRileyTongudai1967,
  totalBoronLee2010,
  totalBoronUppstrom1974,
  totalFluorideRiley1965,
  totalSulfateMorrisRiley1966,
} from '../../../src/chem/saline/totals';
import { kwMillero1995 } from '../../../src/chem/saline/water';
import type { Conditions, ConstantSet } from '../../../src/chem/types';

const CONSTANT_KEYS = [
  'k0',
  'fugacityFactor',
  'k1',
  'k2',
  'kw',
  'kb',
  'ks',
  'kf',
  'k1p',
  'k2p',
  'k3p',
  'ksi',
  'knh4',
  'kh2s',
  'kspCalcite',
  'kspAragonite',
  'freeHFactor',
] as const;
const TOTAL_KEYS = ['totalBoron', 'totalSulfate', 'totalFluoride', 'calcium'] as const;

const OPTION_SETS: SalineOptions[] = [];
for (const carbonic of ['auto', 'lueker2000', 'millero2010'] as const)
  for (const boron of ['lee2010', 'uppstrom1974'] as const)
    for (const fluoride of ['perezfraga1987', 'dicksonriley1979'] as const)
      OPTION_SETS.push({ carbonic, boron, fluoride });

function codeOf(f: () => unknown): { code: string; field: string | undefined } {
  try {
    f();
  } catch (e) {
    if (e instanceof TufaError) return { code: e.code, field: e.field };
    throw e;
  }
  throw new Error('expected a TufaError');
}

describe('salineConstants', () => {
  it('returns the ConstantSet contract', () => {
    expectTypeOf(salineConstants).returns.toEqualTypeOf<ConstantSet>();
    expectTypeOf(salineConstants).parameter(0).toEqualTypeOf<Conditions>();
    expectTypeOf<SalineOptions>().toEqualTypeOf<{
      carbonic?: 'auto' | 'lueker2000' | 'millero2010';
      boron?: 'lee2010' | 'uppstrom1974';
      fluoride?: 'perezfraga1987' | 'dicksonriley1979';
      calcium_mol_kg?: number;
    }>();
  });

  it('at the surface, default options, every field is the formulation it names', () => {
    const c = salineConstants({ temperatureC: 12, salinity: 33, pressureDbar: 0 });
    const tK = 12 + T0_K;
    const s = 33;
    expect(c.model).toBe('saline');
    expect(c.k0).toBe(k0Weiss1974(tK, s));
    expect(c.fugacityFactor).toBe(fugacityFactorWeiss1974(tK));
    expect(c.k1).toBe(k1Lueker2000(tK, s));
    expect(c.k2).toBe(k2Lueker2000(tK, s));
    expect(c.kb).toBe(kbDickson1990b(tK, s));
    expect(c.kw).toBe(kwMillero1995(tK, s));
    expect(c.ks).toBe(ksDickson1990a(tK, s));
    expect(c.kf).toBe(kfPerezFraga1987(tK, s));
    expect(c.k1p).toBe(k1pMillero1995(tK, s));
    expect(c.k2p).toBe(k2pMillero1995(tK, s));
    expect(c.k3p).toBe(k3pMillero1995(tK, s));
    expect(c.ksi).toBe(ksiMillero1995(tK, s));
    expect(c.knh4).toBe(knh4CleggWhitfield1995(tK, s));
    expect(c.kh2s).toBeCloseTo(kh2sMillero1988(tK, s) / c.scaleFactor.seawater, 20);
    expect(c.kspCalcite).toBe(kspCalciteMucci1983(tK, s));
    expect(c.kspAragonite).toBe(kspAragoniteMucci1983(tK, s));
    expect(c.totalBoron).toBe(totalBoronLee2010(s));
    expect(c.totalSulfate).toBe(totalSulfateMorrisRiley1966(s));
    expect(c.totalFluoride).toBe(totalFluorideRiley1965(s));
    expect(c.calcium).toBe(calciumRileyTongudai1967(s));
    expect(c.formulations.k1).toContain('Lueker');
    expect(c.formulations.nbs).toContain('approximate');
  });

  it('options switch the formulations and say so', () => {
    const tK = 12 + T0_K;
    const c = salineConstants(
      { temperatureC: 12, salinity: 20, pressureDbar: 0 },
      { carbonic: 'millero2010', boron: 'uppstrom1974', fluoride: 'dicksonriley1979', calcium_mol_kg: 0.004 },
    );
    expect(c.k1).toBe(k1Millero2010(tK, 20));
    expect(c.k2).toBe(k2Millero2010(tK, 20));
    expect(c.totalBoron).toBe(totalBoronUppstrom1974(20));
    expect(c.kf).toBe(kfDicksonRiley1979(tK, 20));
    expect(c.calcium).toBe(0.004);
    expect(c.formulations).toMatchObject({
      k1: expect.stringContaining('Millero 2010'),
      totalBoron: 'Uppström 1974',
      kf: expect.stringContaining('Dickson & Riley'),
      calcium: 'measured',
    });
  });

  it('shares one frozen formulations object per option combination', () => {
    const a = salineConstants({ temperatureC: 5, salinity: 30, pressureDbar: 0 });
    const b = salineConstants({ temperatureC: 25, salinity: 36, pressureDbar: 100 });
    const m = salineConstants(
      { temperatureC: 25, salinity: 36, pressureDbar: 100 },
      { carbonic: 'millero2010' },
    );
    expect(a.formulations).toBe(b.formulations);
    expect(Object.isFrozen(a.formulations)).toBe(true);
    expect(m.formulations).not.toBe(a.formulations);
  });

  it('copies the conditions rather than keeping the caller object', () => {
    const cond = { temperatureC: 10, salinity: 30, pressureDbar: 0 };
    const c = salineConstants(cond);
    cond.salinity = 1;
    expect(c.conditions).toEqual({ temperatureC: 10, salinity: 30, pressureDbar: 0 });
  });

  it.each(OPTION_SETS)('all fields finite and positive over t 0–40 °C, S 0–45, p 0–5000 dbar: %o', (opts) => {
    for (let t = 0; t <= 40; t += 5)
      for (let s = 0; s <= 45; s += 5)
        for (const p of [0, 500, 1000, 2500, 5000]) {
          const c = salineConstants({ temperatureC: t, salinity: s, pressureDbar: p }, opts);
          for (const k of CONSTANT_KEYS) {
            const v = c[k];
            if (!(Number.isFinite(v) && v > 0)) throw new Error(`${k} = ${v} at t ${t}, S ${s}, p ${p}`);
          }
          for (const k of TOTAL_KEYS) {
            const v = c[k];
            if (!(Number.isFinite(v) && (s > 0 ? v > 0 : v === 0))) throw new Error(`${k} = ${v} at S ${s}`);
          }
          for (const v of Object.values(c.scaleFactor)) expect(Number.isFinite(v) && v > 0).toBe(true);
        }
  });

  it('still gives finite numbers (with warnings) at the corners of what it accepts', () => {
    for (const t of [-3, 100])
      for (const s of [0, 100])
        for (const p of [0, 12000]) {
          const c = salineConstants({ temperatureC: t, salinity: s, pressureDbar: p });
          for (const k of CONSTANT_KEYS)
            expect(Number.isFinite(c[k]) && c[k] > 0, `${k} at ${t}, ${s}, ${p}`).toBe(true);
          expect(c.warnings.length).toBeGreaterThan(0);
        }
  });

  it.each([
    [{ temperatureC: Number.NaN, salinity: 35, pressureDbar: 0 }, CONDITION_NOT_FINITE, 'temperature_c'],
    [
      { temperatureC: 20, salinity: Number.POSITIVE_INFINITY, pressureDbar: 0 },
      CONDITION_NOT_FINITE,
      'salinity',
    ],
    [
      { temperatureC: 20, salinity: 35, pressureDbar: undefined as unknown as number },
      CONDITION_NOT_FINITE,
      'pressure_dbar',
    ],
    [{ temperatureC: 20, salinity: -1, pressureDbar: 0 }, CONDITION_OUT_OF_RANGE, 'salinity'],
    [{ temperatureC: -10, salinity: 35, pressureDbar: 0 }, CONDITION_OUT_OF_RANGE, 'temperature_c'],
    [{ temperatureC: 20, salinity: 35, pressureDbar: -5 }, CONDITION_OUT_OF_RANGE, 'pressure_dbar'],
  ])('rejects %o with %s on %s', (cond, code, field) => {
    expect(codeOf(() => salineConstants(cond))).toEqual({ code, field });
  });

  it.each([
    [{ calcium_mol_kg: -0.001 }, CALCIUM_INVALID],
    [{ calcium_mol_kg: Number.NaN }, CALCIUM_INVALID],
    [{ carbonic: 'made-up' as SalineOptions['carbonic'] }, OPTION_UNKNOWN],
    [{ boron: 'guess' as SalineOptions['boron'] }, OPTION_UNKNOWN],
    [{ fluoride: 'none' as SalineOptions['fluoride'] }, OPTION_UNKNOWN],
  ])('rejects options %o with %s', (opts, code) => {
    const got = codeOf(() => salineConstants({ temperatureC: 20, salinity: 35, pressureDbar: 0 }, opts));
    expect(got.code).toBe(code);
    expect(got.field).toBeTypeOf('string');
  });
});
