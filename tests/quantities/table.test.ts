import { describe, expect, it } from 'vitest';
import { QUANTITIES, quantityForKey } from '../../src/quantities';

describe('the one table of measured quantities', () => {
  it('finds the row an engine warning is about', () => {
    expect(quantityForKey('temperature_c')).toBe('temperature');
    expect(quantityForKey('alkalinity_mg_l_caco3')).toBe('alkalinity');
    expect(quantityForKey('nothing')).toBeUndefined();
  });
  it('has unique quantity and unit ids', () => {
    expect(new Set(QUANTITIES.map((q) => q.id)).size).toBe(QUANTITIES.length);
    for (const q of QUANTITIES) expect(new Set(q.units.map((u) => u.id)).size).toBe(q.units.length);
  });
});
