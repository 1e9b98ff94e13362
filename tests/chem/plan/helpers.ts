import { planWater } from '../../../src/chem/plan/water';

/** Invented waters: a reef tank, a brackish hatchery pond, a cool coastal intake. */
export const REEF = { temperature_c: 25.5, salinity: 35, alkalinity_umol_kg: 2400, ph: 8.05 };
export const POND = {
  temperature_c: 18,
  salinity: 12,
  alkalinity_umol_kg: 1800,
  dic_umol_kg: 1750,
  carbonic_constants: 'millero2010',
};
export const INTAKE = { temperature_c: 12, salinity: 31, alkalinity_umol_kg: 2150, pco2_uatm: 650 };

export const reefWater = (volumeL = 300) => planWater(REEF, { volumeL }, 'reef');
export const pondWater = (volumeL = 5000) => planWater(POND, { volumeL }, 'pond');

/** Invented fresh waters: a spring-fed trout raceway (conductance only) and a planted tank (major ions). */
export const SPRING = {
  temperature_c: 11,
  specific_conductance_us_cm: 420,
  alkalinity_mg_l_caco3: 160,
  ph: 7.1,
  calcium_mg_l: 52,
};
export const PLANTED = {
  temperature_c: 25,
  alkalinity_dkh: 4,
  ph: 7.4,
  calcium_mg_l: 30,
  magnesium_mg_l: 8,
  sodium_mg_l: 10,
  chloride_mg_l: 15,
  sulfate_mg_l: 12,
};
export const springWater = (volumeL = 20000) => planWater(SPRING, { volumeL }, 'spring');
export const plantedWater = (volumeL = 200) => planWater(PLANTED, { volumeL }, 'planted');
