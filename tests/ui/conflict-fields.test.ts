import { describe, expect, it } from 'vitest';
import type { MeasuredValue } from '../../src/store/schema';
import { showValue } from '../../src/ui/sync/conflict-fields';

const values: MeasuredValue[] = [
  { quantity: 'temperature', value: 9.4, unit: 'c' },
  { quantity: 'ph', value: 7.123456, unit: 'ph' },
];

describe('conflict values as a person reads them', () => {
  it('keeps every stored digit in the user’s decimal style', () => {
    expect(showValue('values', values, 'en-GB')).toBe('Temperature 9.4 °C; pH 7.123456');
    expect(showValue('values', values, 'de-DE')).toBe('Temperature 9,4 °C; pH 7,123456');
  });
  it('says "(none)" for an empty field rather than a dash that looks like a value', () => {
    expect(showValue('notes', undefined)).toBe('(none)');
    expect(showValue('notes', '')).toBe('(none)');
    expect(showValue('deleted', true)).toBe('yes (deleted)');
  });
});
