import { describe, expect, it } from 'vitest';
import { isSolveError } from '../../src/chem/api';
import { solve } from '../../src/chem/solve';
import { siteProfile } from '../../src/quantities';
import { airEquilibriumInput, dayPhSwing, degassingSentence, headlineRows } from '../../src/ui/headline';
import { denoise, formatNumber, formatUncertainty } from '../../src/ui/numbers';

const rec = (input: Record<string, unknown>) => {
  const r = solve(input);
  if (isSolveError(r)) throw new Error(JSON.stringify(r.error));
  return r as unknown as Record<string, unknown>;
};

describe('the answer first, in the trade’s units', () => {
  it('gives a reef keeper back the dKH typed, and calcium in mg/L', () => {
    const r = rec({
      temperature_c: 25.5,
      salinity: 35,
      ph: 8.05,
      ph_scale: 'nbs',
      alkalinity_dkh: 8.2,
      calcium_mg_l: 420,
    });
    const rows = headlineRows(siteProfile({ kind: 'reef', defaults: {} }), r, [], 'dkh');
    const by = Object.fromEntries(rows.map((x) => [x.id, x]));
    // The engine converted 8.2 dKH in with the water's density; the same density converts it back.
    expect(by['alkalinity-dkh']!.value).toBeCloseTo(8.2, 9);
    expect(by.calcium!.value).toBeCloseTo(420, 6);
    expect(by['ph-meter']!.value).toBeCloseTo(8.05, 9);
    expect(by['omega-aragonite']!.value).toBe(r.omega_aragonite);
  });
  it('gives a hydrologist pCO2, log pCO2, DIC in mmol/L and mg C/L from the same result', () => {
    const request = {
      temperature_c: 11.2,
      ph: 7.21,
      alkalinity_meq_l: 4.6,
      specific_conductance_us_cm: 612,
      calcium_mg_l: 95,
      air_pco2_uatm: 420,
    };
    const r = rec(request);
    const rows = headlineRows(siteProfile({ kind: 'spring', defaults: {} }), r, [], 'meq_l');
    const by = Object.fromEntries(rows.map((x) => [x.id, x.value]));
    expect(by['log-pco2']).toBeCloseTo(Math.log10((r.pco2_uatm as number) / 1e6), 12);
    expect(by['dic-mg-c-l']! / by['dic-mmol-l']!).toBeCloseTo(12.011, 9); // IUPAC 2021, carbon
    expect(by['alkalinity-meq_l']).toBeCloseTo(4.6, 9);
    const air = rec(airEquilibriumInput(request, r, 420)!);
    expect(air.pco2_uatm as number).toBeCloseTo(420, 6);
    // The air solve is the reading's own request with the air's pair, so it reaches the engine's pH
    // at equilibrium with air (which keeps the sample's ion pairs: a few 1e-5 pH for this water).
    expect(air.ph as number).toBeCloseTo(r.ph_air_equilibrium as number, 3);
    const s = degassingSentence(r, air, (x, d) => formatNumber(x, 'en-GB', { decimals: d }))!;
    expect(s).toMatch(
      /^Losing CO₂ to air, this water would reach pH 8\.7 and SI calcite \+1\.\d: expect calcite to precipitate downstream\.$/,
    );
  });
  it('gives a pond manager hardness as CaCO3 from calcium and magnesium', () => {
    const r = rec({ temperature_c: 22, ph: 6.4, alkalinity_mg_l_caco3: 18, calcium_mg_l: 8.0086 });
    const rows = headlineRows(siteProfile({ kind: 'pond', defaults: {} }), r, [
      { quantity: 'magnesium', unit: 'mg_l', value: 2.4305 },
    ]);
    const by = Object.fromEntries(rows.map((x) => [x.id, x.value]));
    // 8.0086 mg/L Ca = 0.19982 mmol/L, 2.4305 mg/L Mg = 0.1 mmol/L: (0.19982 + 0.1) × 100.087 mg/L.
    expect(by.hardness).toBeCloseTo((8.0086 / 40.078 + 0.1) * 100.0869, 2);
    expect(by['alkalinity-mg_l_caco3']).toBeCloseTo(18, 9);
  });
  it('finds the day’s pH swing from two readings of the same local day', () => {
    const r = {
      id: 'a',
      takenAt: '2026-07-01T04:30:00Z',
      timeZone: 'Europe/Berlin',
      values: [{ quantity: 'ph', unit: 'ph', value: 6.9 }],
    };
    const others = [
      r,
      { id: 'b', takenAt: '2026-07-01T14:00:00Z', values: [{ quantity: 'ph', unit: 'ph', value: 8.6 }] },
      { id: 'c', takenAt: '2026-07-01T23:30:00Z', values: [{ quantity: 'ph', unit: 'ph', value: 9.9 }] }, // next day in Berlin
    ];
    expect(dayPhSwing(r, others)).toEqual({ lo: 6.9, hi: 8.6, n: 2 });
    expect(dayPhSwing(r, [r])).toBeUndefined();
  });
});

describe('numbers as people write them', () => {
  it('shows an uncertainty to two digits, and hides one below the last digit shown', () => {
    expect(formatUncertainty(36.42, 5321, { digits: 4 }, 'en-GB')).toBe('36');
    expect(formatUncertainty(4.4e-12, 6.407, { decimals: 3 }, 'en-GB')).toBe('');
    expect(formatUncertainty(0.0004, 6.407, { decimals: 3 }, 'en-GB')).toBe('');
    expect(formatUncertainty(0.0075, 8.72, { decimals: 2 }, 'en-GB')).toBe('0.0075');
  });
  it('turns float noise into zero and never writes −0', () => {
    expect(denoise(-1.091e-11)).toBe(0);
    expect(denoise(-1.091e-11, 360)).toBe(0);
    expect(denoise(0.5, 360)).toBe(0.5);
    expect(formatNumber(-0.0001, 'en-GB', { decimals: 2 })).toBe('0.00');
  });
});
