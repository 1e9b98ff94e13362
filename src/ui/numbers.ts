/**
 * Reading numbers the way people type them and showing them in their locale. `<input type=number>`
 * drops "7,5" in some browsers, so every numeric field is a text field parsed here.
 */

import type { Issue } from '../chem/errors';

export type Parsed = { ok: true; value: number } | { ok: false; issue: Issue };

function decimalSeparator(locale: string | undefined): string {
  const part = new Intl.NumberFormat(locale || undefined)
    .formatToParts(1.5)
    .find((p) => p.type === 'decimal');
  return part?.value ?? '.';
}

/**
 * Parses "7.5", "7,5", "1 234,5", "1,234.5", "−0,2", "2.3e3". With both separators the last one is
 * the decimal mark. A lone comma is the decimal mark unless it groups thousands ("2,300") in a
 * locale whose decimal mark is the point.
 */
export function parseDecimal(text: string, locale?: string): Parsed {
  let s = text
    .trim()
    .replace(/[\u2212\u2012\u2013]/g, '-')
    .replace(/[\s\u00a0\u202f']/g, '');
  if (s === '') return { ok: false, issue: { code: 'input-empty', message: 'Enter a number.' } };
  const lastComma = s.lastIndexOf(',');
  const lastDot = s.lastIndexOf('.');
  if (lastComma >= 0 && lastDot >= 0) {
    const dec = lastComma > lastDot ? ',' : '.';
    const group = dec === ',' ? '.' : ',';
    s = s.split(group).join('');
    if (dec === ',') s = s.replace(',', '.');
  } else if (lastComma >= 0) {
    const groupsThousands = /^-?\d{1,3}(,\d{3})+$/.test(s);
    if (groupsThousands && decimalSeparator(locale) === '.') s = s.split(',').join('');
    else if ((s.match(/,/g) ?? []).length === 1) s = s.replace(',', '.');
  }
  if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(s)) {
    return { ok: false, issue: { code: 'input-not-a-number', message: `“${text.trim()}” is not a number.` } };
  }
  const value = Number(s);
  if (!Number.isFinite(value)) {
    return { ok: false, issue: { code: 'input-not-a-number', message: `“${text.trim()}” is too large.` } };
  }
  return { ok: true, value };
}

const formatters = new Map<string, Intl.NumberFormat>();

/** A number for the screen: never "NaN"; `digits` significant digits, or `decimals` fixed. */
export function formatNumber(
  value: number | null | undefined,
  locale: string | undefined,
  opts: { digits?: number; decimals?: number } = {},
): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const key = `${locale ?? ''}|${opts.digits ?? ''}|${opts.decimals ?? ''}`;
  let f = formatters.get(key);
  if (!f) {
    f =
      opts.decimals !== undefined
        ? new Intl.NumberFormat(locale || undefined, {
            minimumFractionDigits: opts.decimals,
            maximumFractionDigits: opts.decimals,
          })
        : new Intl.NumberFormat(locale || undefined, { maximumSignificantDigits: opts.digits ?? 4 });
    formatters.set(key, f);
  }
  // "−0" after rounding is float noise: a person writes 0.
  const text = f.format(value);
  return /^[-−]0([.,]0*)?$/.test(text) ? text.slice(1) : text;
}

/** The smallest step the display of `value` with these options can show. */
export function displayResolution(value: number, opts: { digits?: number; decimals?: number }): number {
  if (opts.decimals !== undefined) return 10 ** -opts.decimals;
  if (value === 0 || !Number.isFinite(value)) return 0;
  return 10 ** (Math.floor(Math.log10(Math.abs(value))) - (opts.digits ?? 4) + 1);
}

/**
 * A standard uncertainty as people write it: two significant digits, and nothing at all (empty
 * string) when it is below half the last digit shown for the value, where it means nothing.
 */
export function formatUncertainty(
  u: number,
  value: number,
  opts: { digits?: number; decimals?: number },
  locale: string | undefined,
): string {
  if (!Number.isFinite(u) || u <= 0 || u < displayResolution(value, opts) / 2) return '';
  return formatNumber(u, locale, { digits: 2 });
}

/**
 * A computed change or amount without float noise: anything smaller than `relTo × 1e-9` (or
 * 1e-9 absolute) is an exact zero that rounding made look otherwise (−1.091e-11 → 0).
 */
export function denoise(x: number, relTo = 0): number {
  return Math.abs(x) < Math.max(1e-9, Math.abs(relTo) * 1e-9) ? 0 : x;
}

/** A date-time in the reading's own zone, e.g. "3 May 2026, 09:40". */
export function formatDateTime(
  iso: string,
  timeZone: string | undefined,
  locale: string | undefined,
): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return '—';
  try {
    return new Intl.DateTimeFormat(locale || undefined, {
      dateStyle: 'medium',
      timeStyle: 'short',
      timeZone,
    }).format(d);
  } catch {
    return new Intl.DateTimeFormat(locale || undefined, { dateStyle: 'medium', timeStyle: 'short' }).format(
      d,
    );
  }
}
