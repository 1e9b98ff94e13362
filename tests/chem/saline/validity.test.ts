import { describe, expect, it } from 'vitest';
import {
  KNH4_CLEGGWHITFIELD1995_VALIDITY,
  KNH4_YAOMILLERO1995_VALIDITY,
} from '../../../src/chem/saline/ammonium';
import { KB_DICKSON1990B_VALIDITY } from '../../../src/chem/saline/boric';
import { KSP_MUCCI1983_VALIDITY } from '../../../src/chem/saline/calcium-carbonate';
import { K1K2_LUEKER2000_VALIDITY, K1K2_MILLERO2010_VALIDITY } from '../../../src/chem/saline/carbonic';
import { FUGACITY_WEISS1974_VALIDITY, K0_WEISS1974_VALIDITY } from '../../../src/chem/saline/co2-solubility';
import { salineConstants } from '../../../src/chem/saline/constants';
import { KF_DICKSONRILEY1979_VALIDITY, KF_PEREZFRAGA1987_VALIDITY } from '../../../src/chem/saline/fluoride';
import {
  checkValidity,
  FIELD_PRESSURE,
  FIELD_SALINITY,
  FIELD_TEMPERATURE,
  isInside,
  OUTSIDE_VALIDITY,
  type ValidityRange,
} from '../../../src/chem/saline/issues';
import { KP_MILLERO1995_VALIDITY } from '../../../src/chem/saline/phosphoric';
import { PRESSURE_MILLERO1995_VALIDITY } from '../../../src/chem/saline/pressure';
import { NBS_TAKAHASHI1982_VALIDITY } from '../../../src/chem/saline/scales';
import { KSI_MILLERO1995_VALIDITY } from '../../../src/chem/saline/silicic';
import { KS_DICKSON1990A_VALIDITY } from '../../../src/chem/saline/sulfate';
import { KH2S_MILLERO1988_VALIDITY } from '../../../src/chem/saline/sulfide';
import { TOTALS_FROM_SALINITY_VALIDITY } from '../../../src/chem/saline/totals';
import { KW_MILLERO1995_VALIDITY } from '../../../src/chem/saline/water';

const RANGES: ValidityRange[] = [
  K0_WEISS1974_VALIDITY,
  FUGACITY_WEISS1974_VALIDITY,
  K1K2_LUEKER2000_VALIDITY,
  K1K2_MILLERO2010_VALIDITY,
  KB_DICKSON1990B_VALIDITY,
  KW_MILLERO1995_VALIDITY,
  KS_DICKSON1990A_VALIDITY,
  KF_PEREZFRAGA1987_VALIDITY,
  KF_DICKSONRILEY1979_VALIDITY,
  KP_MILLERO1995_VALIDITY,
  KSI_MILLERO1995_VALIDITY,
  KNH4_CLEGGWHITFIELD1995_VALIDITY,
  KNH4_YAOMILLERO1995_VALIDITY,
  KH2S_MILLERO1988_VALIDITY,
  KSP_MUCCI1983_VALIDITY,
  TOTALS_FROM_SALINITY_VALIDITY,
  PRESSURE_MILLERO1995_VALIDITY,
  NBS_TAKAHASHI1982_VALIDITY,
];

const mid = (r: readonly [number, number] | undefined, otherwise: number) =>
  r === undefined ? otherwise : (r[0] + r[1]) / 2;

describe.each(RANGES.map((r) => [r.label, r] as const))('validity of %s', (_label, range) => {
  const t = mid(range.temperatureC, 20);
  const s = mid(range.salinity, 30);
  const p = mid(range.pressureDbar, 0);

  it('is silent inside its range, including on the bounds', () => {
    expect(isInside(range, t, s, p)).toBe(true);
    expect(checkValidity(range, t, s, p)).toEqual([]);
    if (range.temperatureC) expect(checkValidity(range, range.temperatureC[0], s, p)).toEqual([]);
    if (range.salinity) expect(checkValidity(range, t, range.salinity[1], p)).toEqual([]);
  });

  it.each([
    ['temperatureC', FIELD_TEMPERATURE],
    ['salinity', FIELD_SALINITY],
    ['pressureDbar', FIELD_PRESSURE],
  ] as const)('warns once per condition outside: %s', (key, field) => {
    const r = range[key];
    if (r === undefined) {
      // Unbounded in this condition: even an absurd value must not warn.
      const big = 1e4;
      const args = { temperatureC: t, salinity: s, pressureDbar: p, [key]: big };
      expect(checkValidity(range, args.temperatureC, args.salinity, args.pressureDbar)).toEqual([]);
      return;
    }
    for (const x of [r[0] - 0.5, r[1] + 0.5]) {
      const args = { temperatureC: t, salinity: s, pressureDbar: p, [key]: x };
      const issues = checkValidity(range, args.temperatureC, args.salinity, args.pressureDbar);
      expect(isInside(range, args.temperatureC, args.salinity, args.pressureDbar)).toBe(false);
      expect(issues).toHaveLength(1);
      expect(issues[0]!.code).toBe(OUTSIDE_VALIDITY);
      expect(issues[0]!.field).toBe(field);
      expect(issues[0]!.message).toContain(range.label);
      expect(issues[0]!.message).toContain(x < r[0] ? 'below' : 'above');
      expect(issues[0]!.message).toContain(`${r[0]}–${r[1]}`);
    }
  });
});

describe('salineConstants warns but computes', () => {
  it('open ocean surface water raises no warning and shares one frozen empty list', () => {
    const a = salineConstants({ temperatureC: 20, salinity: 35, pressureDbar: 0 });
    const b = salineConstants({ temperatureC: 15, salinity: 34, pressureDbar: 0 });
    expect(a.warnings).toEqual([]);
    expect(a.warnings).toBe(b.warnings);
    expect(Object.isFrozen(a.warnings)).toBe(true);
  });

  // Lueker 2000 is named: since issue 12 the default takes Millero 2010 below S 19.
  it('brackish water with Lueker 2000 warns about K1/K2 with the salinity field, and still gives numbers', () => {
    const c = salineConstants({ temperatureC: 20, salinity: 8, pressureDbar: 0 }, { carbonic: 'lueker2000' });
    const lueker = c.warnings.filter((w) => w.message.includes('Lueker'));
    expect(lueker).toHaveLength(1);
    expect(lueker[0]).toMatchObject({ code: OUTSIDE_VALIDITY, field: FIELD_SALINITY });
    expect(Number.isFinite(c.k1) && c.k1 > 0).toBe(true);
  });

  it('the same water with the default (Millero 2010 below S 19) does not warn about K1/K2', () => {
    const c = salineConstants({ temperatureC: 20, salinity: 8, pressureDbar: 0 });
    expect(c.warnings.some((w) => w.message.includes('K1 and K2'))).toBe(false);
    expect(c.formulations.k1).toBe('Millero 2010 (total scale)');
  });

  it('the same water with Millero 2010 does not warn about K1/K2', () => {
    const c = salineConstants(
      { temperatureC: 20, salinity: 8, pressureDbar: 0 },
      { carbonic: 'millero2010' },
    );
    expect(c.warnings.some((w) => w.message.includes('K1 and K2'))).toBe(false);
  });

  it('the deepest trenches warn about the pressure terms', () => {
    const c = salineConstants({ temperatureC: 10, salinity: 34.7, pressureDbar: 11000 });
    expect(c.warnings.map((w) => w.field)).toEqual([FIELD_PRESSURE]);
  });

  it('fresh water warns about every salinity fit that starts above 0, each once', () => {
    const c = salineConstants({ temperatureC: 20, salinity: 0, pressureDbar: 0 });
    const labels = c.warnings.map((w) => w.message.split(': fitted')[0]);
    expect(new Set(labels).size).toBe(labels.length);
    // The default K1/K2 at S 0 is Millero 2010 (fitted from S 1), not Lueker 2000 as before issue 12.
    for (const name of [
      'Millero 2010',
      'Dickson 1990b',
      'Dickson 1990a',
      'Perez & Fraga',
      'Mucci',
      'Takahashi',
    ]) {
      expect(labels.some((l) => l?.includes(name))).toBe(true);
    }
    expect(labels.some((l) => l?.includes('KW'))).toBe(false);
  });
});
