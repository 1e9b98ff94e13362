import { describe, expect, it } from 'vitest';
import { plainKey, plainWords } from '../../src/ui/plain-words';

describe('engine keys in words', () => {
  it('names a key by the quantity and unit the form shows', () => {
    expect(plainKey('specific_conductance_us_cm')).toBe('Specific conductance (25 °C) (µS/cm)');
    expect(plainKey('alkalinity_meq_l')).toBe('Alkalinity (meq/L)');
    expect(plainKey('temperature_c')).toBe('Temperature (°C)');
    expect(plainKey('ph')).toBe('pH');
    expect(plainKey('pk1')).toBe('pK1');
    expect(plainKey('pksp_calcite')).toBe('calcite solubility'); // no engine key on screen (issue 11)
  });
  it('rewrites every snake_case key in a message and leaves other words alone', () => {
    expect(
      plainWords(
        'Give specific_conductance_us_cm for a better estimate; alkalinity_meq_l are fresh-water inputs',
      ),
    ).toBe(
      'Give specific conductance (25 °C) (µS/cm) for a better estimate; alkalinity (meq/L) are fresh-water inputs',
    );
    expect(plainWords('temperature_c is missing. dic_umol_kg given')).toBe(
      'Temperature (°C) is missing. DIC (µmol/kg) given',
    );
    expect(plainWords('no_such_key stays as it is')).toBe('no_such_key stays as it is');
    // The planner's keys too (issue 11: "volume_l must be…" reached the screen).
    expect(plainWords('volume_l must be greater than zero')).toBe(
      'Water volume (L) must be greater than zero',
    );
  });
});
