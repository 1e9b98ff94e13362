import { describe, expect, it } from 'vitest';
import { RESULT_CAUTION, resultAlerts } from '../../src/ui/cautions';

describe('cautions', () => {
  it('defers to labels, codes and licensed practice', () => {
    expect(RESULT_CAUTION).toMatch(/product label/);
    expect(RESULT_CAUTION).toMatch(/local codes/);
    expect(RESULT_CAUTION).toMatch(/licensed practice/);
  });
  it('warns about aragonite undersaturation only in sea water, and about very high pCO2 everywhere', () => {
    expect(resultAlerts({ model: 'saline', omega_aragonite: 0.8 })).toHaveLength(1);
    expect(resultAlerts({ model: 'fresh', omega_aragonite: 0.4 })).toHaveLength(0);
    expect(resultAlerts({ model: 'fresh', pco2_uatm: 25000 })).toHaveLength(1);
    expect(resultAlerts({ model: 'saline', pco2_uatm: 400, omega_aragonite: 3 })).toHaveLength(0);
  });
});
