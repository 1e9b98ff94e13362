import { describe, expect, it } from 'vitest';
import type { TufaError } from '../../../src/chem/errors';
import { pointsFromTable } from '../../../src/chem/titration/pointsFromTable';

const code = (text: string) => {
  try {
    pointsFromTable(text);
    return 'none';
  } catch (e) {
    return (e as TufaError).code;
  }
};

describe('titration points from a spreadsheet table', () => {
  it('reads comma-separated volumes and pH', () => {
    expect(pointsFromTable('volume_ml,ph\r\n0,7.91\r\n0.5,7.42\r\n')).toEqual([
      { volume_ml: 0, ph: 7.91 },
      { volume_ml: 0.5, ph: 7.42 },
    ]);
  });
  it('reads semicolons with decimal commas and a byte-order mark', () => {
    expect(pointsFromTable('\uFEFFpH;volume_ml;note\n7,91;0;start\n7,42;0,5;"stirred; cloudy"\n')).toEqual([
      { volume_ml: 0, ph: 7.91 },
      { volume_ml: 0.5, ph: 7.42 },
    ]);
  });
  it('reads digital titrator counts', () => {
    expect(pointsFromTable('counts,ph\n0,8.1\n120,7.6\n')).toEqual([
      { counts: 0, ph: 8.1 },
      { counts: 120, ph: 7.6 },
    ]);
  });
  it.each([
    ['', 'titration-table-empty'],
    ['volume,acidity\n1,2\n', 'titration-table-header'],
    ['volume_ml,ph\n0,seven\n', 'titration-value-invalid'],
    ['volume_ml,ph\n0,\n', 'titration-value-invalid'],
  ])('%j → %s', (text, expected) => {
    expect(code(text)).toBe(expected);
  });
});
