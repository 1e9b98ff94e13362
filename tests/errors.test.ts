import { describe, expect, it } from 'vitest';
import { TufaError, toIssue } from '../src/chem/errors';

describe('errors are values', () => {
  it('keeps code, message and field', () => {
    const issue = toIssue(new TufaError('pair-same-family', 'pCO2 and fCO2 are one family', 'fco2_uatm'));
    expect(issue).toEqual({
      code: 'pair-same-family',
      message: 'pCO2 and fCO2 are one family',
      field: 'fco2_uatm',
    });
  });
  it('wraps unknown throws as internal-error', () => {
    expect(toIssue(new Error('boom')).code).toBe('internal-error');
  });
});
