import { describe, expect, it } from 'vitest';
import { QUANTITIES, quantityForKey, toSolveInput } from '../../src/ui/quantities';

describe('measured quantities map to solve input keys', () => {
  it('maps rows by unit, converting only exactly-known units', () => {
    const { input, unknown } = toSolveInput(
      [
        { quantity: 'temperature', value: 77, unit: 'f' },
        { quantity: 'alkalinity', value: 8.4, unit: 'dkh' },
        { quantity: 'ph', value: 8.1, unit: 'ph' },
        { quantity: 'turbidity', value: 3, unit: 'ntu' },
      ],
      { model: 'saline', ph_scale: 'nbs', salinity: 35 },
    );
    expect(input.temperature_c).toBeCloseTo(25, 12); // (77 − 32) × 5/9, exact by definition of °F
    expect(input.alkalinity_dkh).toBe(8.4);
    expect(input.ph).toBe(8.1);
    expect(input.salinity).toBe(35);
    expect(input.model).toBe('saline');
    expect(unknown).toEqual(['turbidity (ntu)']);
  });
  it('takes the pH scale from a unit that names it, over the site or settings scale', () => {
    for (const scale of ['total', 'free', 'seawater', 'nbs']) {
      const { input, unknown } = toSolveInput([{ quantity: 'ph', value: 7.95, unit: scale }], {
        model: 'saline',
        ph_scale: scale === 'nbs' ? 'total' : 'nbs',
      });
      expect(unknown).toEqual([]);
      expect(input.ph).toBe(7.95);
      expect(input.ph_scale).toBe(scale);
    }
    // Plain `ph` keeps the scale of the context.
    expect(
      toSolveInput([{ quantity: 'ph', value: 8, unit: 'ph' }], { ph_scale: 'free' }).input.ph_scale,
    ).toBe('free');
  });
  it('knows every pH unit id the importer writes', async () => {
    const io = await import('../../src/io/quantities');
    const ui = QUANTITIES.find((q) => q.id === 'ph')!.units.map((u) => u.id);
    const imported = io.QUANTITIES.find((q) => q.id === 'ph')!.units.map((u) => u.id);
    expect(ui.sort()).toEqual(imported.sort());
  });
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
