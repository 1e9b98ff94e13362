import { describe, expect, it } from 'vitest';
import { solve } from '../../../src/chem/solve';
import { pkaAmmoniaEmerson1975, unionizedAmmonia } from '../../../src/chem/trades/ammonia';
import {
  co2FluxMmolM2D,
  k600Raymond2012,
  kCo2FromK600,
  schmidtCo2,
  schmidtCo2Fresh,
  schmidtCo2Seawater,
} from '../../../src/chem/trades/gasExchange';
import {
  nernstSlopeMv,
  phCalibration,
  phUncertaintyFromCalibration,
} from '../../../src/chem/trades/phCalibration';
import { hydrogenSulfide } from '../../../src/chem/trades/sulfide';
import { EMERSON1975 } from '../../fixtures/emerson1975';
import { WANNINKHOF2014 } from '../../fixtures/wanninkhof2014';

const solved = (input: Record<string, unknown>) => {
  const r = solve(input);
  if ('error' in r) throw new Error(r.error.message);
  return r;
};

describe('published check values per source', () => {
  it.each(EMERSON1975)('$source: $quantity at $temperatureC °C', (c) => {
    const pka = pkaAmmoniaEmerson1975(c.temperatureC);
    const got = c.id === 'pka' ? pka : unionizedAmmonia(1, 8, pka).fraction * 100;
    expect(Math.abs(got - c.value)).toBeLessThanOrEqual(c.tolerance);
  });
  it.each(WANNINKHOF2014)('$source: $quantity at $temperatureC °C', (c) => {
    const got = c.salinity === 0 ? schmidtCo2Fresh(c.temperatureC) : schmidtCo2Seawater(c.temperatureC);
    expect(Math.abs(got - c.value)).toBeLessThanOrEqual(c.tolerance);
  });
});

describe('unionized ammonia (Emerson et al. 1975)', () => {
  it('pKa = 0.09018 + 2729.92/T: 9.2464 at 25 °C, near Bates & Pinching (1949) 9.245 (memory)', () => {
    expect(pkaAmmoniaEmerson1975(25)).toBeCloseTo(0.09018 + 2729.92 / 298.15, 12);
    expect(Math.abs(pkaAmmoniaEmerson1975(25) - 9.245)).toBeLessThan(0.002);
  });
  it('fraction at 20 °C, pH 8.0: 3.8 % (Emerson et al. 1975, Table 1 lists 3.82 %; memory)', () => {
    const a = unionizedAmmonia(2, 8, pkaAmmoniaEmerson1975(20));
    expect(a.fraction * 100).toBeCloseTo(3.82, 1);
    expect(a.nh3_n_mg_l).toBeCloseTo(2 * a.fraction, 12);
    expect(a.nh3_mg_l / a.nh3_n_mg_l).toBeCloseTo(17.031 / 14.007, 10);
  });
  it('half ionised at pH = pK', () => {
    expect(unionizedAmmonia(1, 9.3, 9.3).fraction).toBeCloseTo(0.5, 12);
  });
  it('solve: fresh water at I = 0 uses Emerson on the activity scale', () => {
    const r = solved({
      temperature_c: 20,
      ph: 8,
      alkalinity_meq_l: 2,
      model: 'fresh',
      ionic_strength_mol_kg: 0,
      total_ammonia_n_mg_l: 1,
    });
    expect(r.ammonia_pk).toBeCloseTo(pkaAmmoniaEmerson1975(20), 10);
    expect(r.unionized_ammonia_fraction).toBeCloseTo(1 / (1 + 10 ** (pkaAmmoniaEmerson1975(20) - 8)), 10);
    expect(r.unionized_ammonia_n_mg_l).toBeCloseTo(r.unionized_ammonia_fraction!, 10);
  });
  it('solve: fresh water at I = 0.01 raises pK by −log γNH4+ + log γNH3 (K′ = Ka·γNH4/γNH3) and counts ammonia in alkalinity', () => {
    const base = { temperature_c: 20, ph: 8, dic_umol_kg: 2000, model: 'fresh', ionic_strength_mol_kg: 0.01 };
    const r = solved({ ...base, total_ammonia_n_mg_l: 1 });
    const without = solved(base);
    // Davies at I = 0.01, 20 °C: log γ(±1) ≈ −0.045; neutral log γ = 0.1·I (the model's salting-out).
    expect(r.ammonia_pk! - pkaAmmoniaEmerson1975(20)).toBeGreaterThan(0.04);
    expect(r.ammonia_pk! - pkaAmmoniaEmerson1975(20)).toBeLessThan(0.05);
    expect(r.alkalinity_umol_kg).toBeGreaterThan(without.alkalinity_umol_kg);
  });
  it('solve: seawater uses the engine ammonium constant on the total scale', () => {
    const r = solved({
      temperature_c: 25,
      salinity: 35,
      ph: 8,
      alkalinity_umol_kg: 2300,
      total_ammonia_n_mg_l: 1,
    });
    expect(r.ammonia_pk).toBeCloseTo(r.constants.pknh4!, 10);
    expect(r.unionized_ammonia_fraction).toBeCloseTo(1 / (1 + 10 ** (r.constants.pknh4! - r.ph_total)), 10);
  });
  it('refuses ammonia given twice', () => {
    const r = solve({
      temperature_c: 20,
      ph: 8,
      alkalinity_meq_l: 2,
      model: 'fresh',
      ammonia_umol_kg: 10,
      total_ammonia_n_mg_l: 1,
    });
    expect('error' in r && r.error.code).toBe('ammonia-given-twice');
  });
});

describe('hydrogen sulfide', () => {
  it('half H2S at pH = pK1; solve uses the engine K1 of the model', () => {
    expect(hydrogenSulfide(1, 7, 7).fraction).toBeCloseTo(0.5, 12);
    const r = solved({
      temperature_c: 25,
      ph: 7,
      alkalinity_meq_l: 2,
      model: 'fresh',
      ionic_strength_mol_kg: 0,
      total_sulfide_s_mg_l: 1,
    });
    expect(r.sulfide_pk1).toBeCloseTo(r.constants.pkh2s!, 10);
    // Nordstrom et al. (1990) pK1 of H2S 6.994 at 25 °C (memory).
    expect(r.sulfide_pk1!).toBeCloseTo(6.994, 2);
    expect(r.hydrogen_sulfide_mg_l).toBeCloseTo(r.hydrogen_sulfide_fraction! * (34.076 / 32.06), 10);
  });
});

describe('CO2 gas exchange', () => {
  it('Schmidt numbers of Wanninkhof (2014): 600 fresh and 668 seawater at 20 °C (memory)', () => {
    expect(schmidtCo2Fresh(20)).toBeCloseTo(600, 0);
    expect(schmidtCo2Seawater(20)).toBeCloseTo(668, 0);
    expect(schmidtCo2(20, 17.5)).toBeCloseTo((schmidtCo2Fresh(20) + schmidtCo2Seawater(20)) / 2, 10);
  });
  it('k_CO2 = k600 at Sc 600; half at Sc 2400 with exponent 0.5', () => {
    expect(kCo2FromK600(3, 600)).toBeCloseTo(3, 12);
    expect(kCo2FromK600(3, 2400)).toBeCloseTo(1.5, 12);
    expect(kCo2FromK600(3, 600 * 8, 2 / 3)).toBeCloseTo(0.75, 12);
  });
  it('Raymond et al. (2012): k600 = 5037 (V S)^0.89 D^0.54', () => {
    expect(k600Raymond2012(0.01, 0.3, 0.4)).toBeCloseTo(5037 * 0.003 ** 0.89 * 0.4 ** 0.54, 10);
  });
  it('flux unit: 1 m/d across 1 µmol/kg of CO2 in water of 1 kg/L is 1 mmol m-2 d-1', () => {
    expect(co2FluxMmolM2D(1, 2e-6, 1e-6, 1)).toBeCloseTo(1, 12);
  });
  it('solve: a supersaturated stream loses CO2; at the air pCO2 the flux is zero', () => {
    const stream = {
      temperature_c: 12,
      ph: 7.6,
      alkalinity_meq_l: 1.5,
      model: 'fresh',
      stream_slope: 0.005,
      stream_velocity_m_s: 0.4,
      stream_depth_m: 0.3,
    };
    const r = solved(stream);
    expect(r.pco2_uatm).toBeGreaterThan(420);
    expect(r.co2_flux_mmol_m2_d!).toBeGreaterThan(0);
    expect(r.k600_m_d).toBeCloseTo(k600Raymond2012(0.005, 0.4, 0.3), 10);
    const atAir = solved({
      temperature_c: 12,
      pco2_uatm: 420,
      alkalinity_meq_l: 1.5,
      model: 'fresh',
      k600_m_d: 5,
    });
    expect(Math.abs(atAir.co2_flux_mmol_m2_d!)).toBeLessThan(1e-6);
    const r2 = solve({ ...stream, stream_depth_m: undefined });
    expect('error' in r2 && r2.error.code).toBe('stream-incomplete');
  });
  it('a request without the new keys has none of the new outputs', () => {
    const r = solved({ temperature_c: 12, ph: 7.6, alkalinity_meq_l: 1.5, model: 'fresh' });
    expect(r.co2_flux_mmol_m2_d).toBeUndefined();
    expect(r.unionized_ammonia_fraction).toBeUndefined();
  });
});

describe('pH meter calibration', () => {
  it('Nernst slope 59.16 mV per pH at 25 °C', () => {
    expect(nernstSlopeMv(25)).toBeCloseTo(59.16, 2);
  });
  it('an ideal electrode: 100 %, offset 0, accepted', () => {
    const s = nernstSlopeMv(25);
    const cal = phCalibration({
      temperature_c: 25,
      buffers: [4.01, 7.0, 10.01].map((ph) => ({ ph, mv: -s * (ph - 7) })),
    });
    expect(cal.slope_percent).toBeCloseTo(100, 10);
    expect(cal.offset_mv).toBeCloseTo(0, 10);
    expect(cal.accepted).toBe(true);
    expect(phUncertaintyFromCalibration(cal, 7.5)).toBeCloseTo(0.01, 10);
  });
  it('a tired electrode (92 %, +35 mV) is refused, and its pH uncertainty grows away from the buffers', () => {
    const s = nernstSlopeMv(20) * 0.92;
    const cal = phCalibration({
      temperature_c: 20,
      buffers: [
        { ph: 4.0, mv: 35 - s * -3 },
        { ph: 7.02, mv: 35 - s * 0.02 },
      ],
    });
    expect(cal.slope_percent).toBeCloseTo(92, 8);
    expect(cal.offset_mv).toBeCloseTo(35, 8);
    expect(cal.accepted).toBe(false);
    expect(cal.reasons).toHaveLength(2);
    expect(phUncertaintyFromCalibration(cal, 8.5)).toBeGreaterThan(phUncertaintyFromCalibration(cal, 5.5));
  });
  it('bad records are errors with codes', () => {
    expect(() => phCalibration({ temperature_c: 25, buffers: [{ ph: 7, mv: 0 }] })).toThrow(/two buffers/);
    expect(() =>
      phCalibration({
        temperature_c: 25,
        buffers: [
          { ph: 7, mv: 0 },
          { ph: 7, mv: 1 },
        ],
      }),
    ).toThrow(/differ/);
  });
  it('solve: the calibration is reported, warns when refused, and feeds the pH uncertainty', () => {
    const s = nernstSlopeMv(18);
    const good = {
      temperature_c: 18,
      buffers: [4.0, 7.0, 10.06].map((ph, i) => ({ ph, mv: -0.99 * s * (ph - 7) + 4 + (i - 1) * 0.3 })),
      time: '2026-11-14T08:10:00Z',
    };
    const water = { temperature_c: 18, ph: 7.4, alkalinity_meq_l: 2, model: 'fresh', ph_calibration: good };
    const r = solved({ ...water, uncertainty: { alkalinity_meq_l: 0.02 } });
    expect(r.ph_calibration!.accepted).toBe(true);
    expect(r.ph_calibration!.slope_percent).toBeCloseTo(99, 0);
    const u = r.ph_calibration!.ph_standard_uncertainty!;
    expect(u).toBeGreaterThan(0.01);
    expect(r.uncertainty!.pco2_uatm!.contributions.ph).toBeGreaterThan(0);
    // The pH uncertainty moves pCO2 exactly as an explicit "ph": u would.
    const explicit = solved({ ...water, uncertainty: { alkalinity_meq_l: 0.02, ph: u } });
    expect(r.uncertainty!.pco2_uatm!.standard_uncertainty).toBeCloseTo(
      explicit.uncertainty!.pco2_uatm!.standard_uncertainty,
      10,
    );
    const bad = {
      temperature_c: 18,
      buffers: [
        { ph: 4, mv: 150 },
        { ph: 7, mv: 0 },
      ],
    };
    const refused = solved({ ...water, ph_calibration: bad });
    expect(refused.warnings.map((w) => w.code)).toContain('ph-calibration-refused');
  });
});
