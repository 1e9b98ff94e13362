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
