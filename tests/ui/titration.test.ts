import { describe, expect, it } from 'vitest';
import { EMPTY_TITRATION, recordFromForm } from '../../src/ui/screens/TitrationSection';
import { parsePoints } from '../../src/ui/titration';

describe('typed titration points', () => {
  it('reads tabs, semicolons, spaces, decimal commas and skips headers', () => {
    const { points, issues } = parsePoints(
      'volume_ml\tph\n0\t7,16\n0,053;7,05\n0.106 6.94\n\n0.2,6.5',
      'de-DE',
    );
    expect(issues).toEqual([]);
    expect(points).toEqual([
      { volumeMl: 0, ph: 7.16 },
      { volumeMl: 0.053, ph: 7.05 },
      { volumeMl: 0.106, ph: 6.94 },
      { volumeMl: 0.2, ph: 6.5 },
    ]);
  });
  it('reports bad lines with codes and line numbers', () => {
    const { issues } = parsePoints('0.1 7.0\n0.2\n0.3 x', 'en-GB');
    expect(issues.map((i) => i.code)).toEqual(['titration-point-format', 'titration-point-not-a-number']);
    expect(issues[0]!.message).toContain('Line 2');
  });
  it('an empty form is no titration; a partial one says what is missing', () => {
    expect(recordFromForm(EMPTY_TITRATION, 'en-GB')).toEqual({ issues: [] });
    const r = recordFromForm({ ...EMPTY_TITRATION, pointsText: '0 7\n1 4' }, 'en-GB');
    expect(r.record).toBeUndefined();
    expect(r.issues.map((i) => i.code)).toContain('titration-field-missing');
  });
});
