import { describe, expect, it } from 'vitest';
import { formatNumber, parseDecimal } from '../../src/ui/numbers';

const value = (t: string, locale?: string) => {
  const p = parseDecimal(t, locale);
  return p.ok ? p.value : p.issue.code;
};

describe('numbers as people type them', () => {
  it.each([
    ['7.5', 'en-GB', 7.5],
    ['7,5', 'en-GB', 7.5],
    ['7,5', 'de-DE', 7.5],
    ['1 234,5', 'fr-FR', 1234.5],
    ['1.234,5', 'de-DE', 1234.5],
    ['1,234.5', 'en-GB', 1234.5],
    ['2,300', 'en-GB', 2300],
    ['2,300', 'de-DE', 2.3],
    ['−0,2', 'de-DE', -0.2],
    ['2.3e3', 'en-GB', 2300],
    ['  8.05 ', 'en-GB', 8.05],
  ])('%s in %s is %d', (t, locale, v) => expect(value(t, locale)).toBe(v));

  it.each(['12..5', 'abc', '7,5,1', '1e999', '--3'])('refuses %s with a code', (t) => {
    expect(value(t, 'en-GB')).toBe('input-not-a-number');
  });
  it('says an empty field is empty', () => expect(value('  ')).toBe('input-empty'));

  it('never shows NaN', () => {
    expect(formatNumber(Number.NaN, 'en-GB')).toBe('—');
    expect(formatNumber(Number.POSITIVE_INFINITY, 'en-GB')).toBe('—');
    expect(formatNumber(undefined, 'en-GB')).toBe('—');
  });
  it('formats in the locale', () => {
    expect(formatNumber(2069.87, 'en-GB', { digits: 4 })).toBe('2,070');
    expect(formatNumber(8.0512, 'de-DE', { decimals: 2 })).toBe('8,05');
  });
});
