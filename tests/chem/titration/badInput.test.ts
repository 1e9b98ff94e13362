import { describe, expect, it } from 'vitest';
import { freshTitrationConstants } from '../../../src/chem/titration/reduceTitration';
import { titrate } from '../../../src/chem/titration/titrate';
import type { TitrationInput } from '../../../src/chem/titration/types';
import { constantsAt25 } from './constantsFixture';
import { syntheticTitration } from './syntheticTitration';

const k = constantsAt25();
const make = () => k;
const base = syntheticTitration(
  {
    sample: { alkalinity: 2e-3, dic: 2.3e-3 },
    sampleVolumeMl: 100,
    titrantEqL: 0.1,
    points: 30,
    finalPh: 3.2,
    phNoise: 0,
    seed: 1,
  },
  k,
);

function codeOf(input: unknown): string | undefined {
  const r = titrate(input as TitrationInput, make);
  return 'error' in r ? r.error.code : undefined;
}
function warningsOf(input: TitrationInput): string[] {
  const r = titrate(input, make);
  if ('error' in r) throw new Error(r.error.message);
  return r.warnings.map((w) => w.code);
}

describe('bad titrations get a code, never NaN', () => {
  it.each([
    ['no sample volume', { ...base, sample_volume_ml: undefined }, 'titration-value-invalid'],
    ['zero normality', { ...base, titrant_normality: 0 }, 'titration-value-invalid'],
    [
      'pH as text',
      { ...base, points: base.points.map((p, i) => (i === 3 ? { ...p, ph: '7,1' } : p)) },
      'titration-value-invalid',
    ],
    [
      'pH NaN',
      { ...base, points: base.points.map((p, i) => (i === 3 ? { ...p, ph: Number.NaN } : p)) },
      'titration-value-invalid',
    ],
    ['three points', { ...base, points: base.points.slice(0, 3) }, 'titration-too-few-points'],
    ['no points', { ...base, points: undefined }, 'titration-points-missing'],
    [
      'volumes out of order',
      { ...base, points: [...base.points].reverse() },
      'titration-volume-not-increasing',
    ],
    [
      'counts without factor',
      { ...base, points: base.points.map((p) => ({ counts: p.volume_ml! * 100, ph: p.ph })) },
      'titration-counts-factor-missing',
    ],
    ['unknown method', { ...base, method: 'guess' }, 'titration-method-unknown'],
    [
      'endpoint never crossed',
      { ...base, method: 'endpoint', points: base.points.filter((p) => p.ph > 5) },
      'titration-endpoint-not-crossed',
    ],
    [
      'starts below endpoint',
      { ...base, method: 'endpoint', points: base.points.filter((p) => p.ph < 4.4) },
      'titration-starts-below-endpoint',
    ],
    [
      'gran without acid excess',
      { ...base, method: 'gran', points: base.points.filter((p) => p.ph > 4.1) },
      'gran-too-few-points',
    ],
    [
      'gran never crossing',
      { ...base, method: 'gran', points: base.points.filter((p) => p.ph > 4.6) },
      'titration-endpoint-not-crossed',
    ],
    [
      'inflection not reached',
      { ...base, method: 'inflection', points: base.points.filter((p) => p.ph > 5.5) },
      'titration-endpoint-not-crossed',
    ],
    [
      // One reading past the steepest fall: the peak of dpH/dV is not inside the readings.
      'inflection barely past',
      { ...base, method: 'inflection', points: base.points.filter((p) => p.ph > 4.4) },
      'inflection-not-found',
    ],
    ['negative uncertainty', { ...base, uncertainty: { titrant_normality: -1 } }, 'uncertainty-invalid'],
    ['uncertainty of an unknown input', { ...base, uncertainty: { colour: 1 } }, 'uncertainty-unknown-input'],
  ])('%s', (_name, input, code) => {
    expect(codeOf(input)).toBe(code);
  });

  it('warns about a pH that rises with added acid', () => {
    const points = base.points.map((p, i) => (i === 5 ? { ...p, ph: p.ph + 0.3 } : p));
    expect(warningsOf({ ...base, points })).toContain('titration-ph-not-monotonic');
  });

  it('warns when only three points lie past the endpoint', () => {
    const three = [
      ...base.points.filter((p) => p.ph > 4.0),
      ...base.points.filter((p) => p.ph <= 4.0).slice(0, 3),
    ];
    expect(three.filter((p) => p.ph <= 4.0)).toHaveLength(3);
    expect(warningsOf({ ...base, method: 'gran', points: three })).toContain('gran-few-points');
  });

  it('warns when few readings lie past the endpoint, and the curve fit when it must extrapolate', () => {
    const few = [
      ...base.points.filter((p) => p.ph > 4.5),
      ...base.points.filter((p) => p.ph < 4.5).slice(0, 2),
    ];
    expect(warningsOf({ ...base, method: 'endpoint', points: few })).toContain(
      'titration-few-points-past-endpoint',
    );
    const short = base.points.filter((p) => p.ph > 4.7);
    expect(warningsOf({ ...base, method: 'curve_fit', points: short })).toContain(
      'titration-endpoint-not-crossed',
    );
  });

  it('warns when the ionic strength had to be guessed', () => {
    expect(warningsOf({ ...base, ionic_strength_mol_kg: undefined })).toContain('ionic-strength-estimated');
    expect(
      warningsOf({ ...base, ionic_strength_mol_kg: undefined, specific_conductance_us_cm: 400 }),
    ).not.toContain('ionic-strength-estimated');
  });
});

describe('outside the validity of the fresh-water constants', () => {
  it('a hot spring at 72 °C is still reduced, with a validity warning from the constants', () => {
    const r = titrate({ ...base, temperature_c: 72, method: 'curve_fit' }, freshTitrationConstants);
    if ('error' in r) throw new Error(r.error.message);
    expect(r.warnings.map((w) => w.code)).toContain('formulation-out-of-range');
    expect(Number.isFinite(r.alkalinity_meq_l)).toBe(true);
  });
});

describe('digital titrator counts', () => {
  it('counts with a counts-per-mL factor reduce like the volumes they stand for', () => {
    const perMl = 800;
    const counted = {
      ...base,
      counts_per_ml: perMl,
      points: base.points.map((p) => ({ counts: p.volume_ml! * perMl, ph: p.ph })),
    };
    const a = titrate(base, make);
    const b = titrate(counted, make);
    if ('error' in a || 'error' in b) throw new Error('unexpected error');
    expect(b.equivalence_volume_ml).toBeCloseTo(a.equivalence_volume_ml, 10);
  });
});

describe('re-reduction', () => {
  it('the raw record is not changed by a reduction and re-reduces with another method', () => {
    const record = structuredClone(base);
    const frozen = JSON.stringify(record);
    const a = titrate({ ...record, method: 'gran' }, make);
    const b = titrate({ ...record, method: 'curve_fit' }, make);
    expect(JSON.stringify(record)).toBe(frozen);
    if ('error' in a || 'error' in b) throw new Error('unexpected error');
    expect(a.method).toBe('gran');
    expect(b.method).toBe('curve_fit');
    expect(Math.abs(a.alkalinity_meq_l / b.alkalinity_meq_l - 1)).toBeLessThan(0.01);
  });
});
