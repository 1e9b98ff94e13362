/**
 * Physical constants and fixed conversion factors, one place, units in the names.
 * Sources: CODATA 2018 (R), IUPAC 2021 standard atomic weights (molar masses).
 */

/** 0 °C in kelvin. */
export const T0_K = 273.15;
/** Molar gas constant, CODATA 2018, in cm3 bar mol-1 K-1 (the unit of the Millero 1995 pressure terms). */
export const R_CM3_BAR_PER_MOL_K = 83.14462618;
/** Molar gas constant, CODATA 2018, in J mol-1 K-1. */
export const R_J_PER_MOL_K = 8.314462618;
/** One standard atmosphere in pascal. */
export const ATM_PA = 101325;
/** Decibar to bar. */
export const DBAR_PER_BAR = 10;
/** ln(10), for switching between natural and decadic logarithms. */
export const LN10 = Math.LN10;

/** Molar masses in g/mol (IUPAC 2021 standard atomic weights, abridged). */
export const MOLAR_MASS_G_PER_MOL = {
  CaCO3: 100.0869,
  HCO3: 61.0168,
  CO3: 60.0089,
  CO2: 44.0095,
  Ca: 40.078,
  Mg: 24.305,
  Na: 22.98977,
  K: 39.0983,
  Cl: 35.453,
  SO4: 96.0626,
  CaO: 56.0774,
  B: 10.811,
  F: 18.998403,
} as const;
