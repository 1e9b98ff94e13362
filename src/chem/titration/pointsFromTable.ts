/**
 * Titration points from a spreadsheet export: a header row naming `volume_ml` (or `counts`) and
 * `ph`, then one reading per row. Accepts comma-separated files and the semicolon-separated files
 * with decimal commas that many spreadsheets write in continental locales, with or without a
 * UTF-8 byte-order mark. Refusals are coded errors naming the row.
 */

import { fail } from '../errors';
import type { TitrationPoint } from './types';

function splitRow(line: string, sep: string): string[] {
  const out: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const c = line[i]!;
    if (quoted) {
      if (c === '"' && line[i + 1] === '"') {
        field += '"';
        i++;
      } else if (c === '"') quoted = false;
      else field += c;
    } else if (c === '"') quoted = true;
    else if (c === sep) {
      out.push(field.trim());
      field = '';
    } else field += c;
  }
  out.push(field.trim());
  return out;
}

export function pointsFromTable(text: string): TitrationPoint[] {
  const lines = text
    .replace(/^\uFEFF/, '')
    .split(/\r?\n/)
    .filter((l) => l.trim() !== '');
  const header = lines[0];
  if (header === undefined) fail('titration-table-empty', 'The points table is empty.', 'points');
  // A header with semicolons and no commas outside quotes is the decimal-comma dialect.
  const sep = header.includes(';') ? ';' : ',';
  const decimalComma = sep === ';';
  const names = splitRow(header, sep).map((h) => h.toLowerCase());
  const iPh = names.indexOf('ph');
  const iVolume = names.indexOf('volume_ml');
  const iCounts = names.indexOf('counts');
  if (iPh < 0 || (iVolume < 0 && iCounts < 0)) {
    fail(
      'titration-table-header',
      'The points table needs a header row with a "ph" column and a "volume_ml" (or "counts") column.',
      'points',
    );
  }
  const number = (raw: string | undefined, row: number, column: string): number => {
    const text = (raw ?? '').replace(/\s/g, '');
    const normal = decimalComma ? text.replace(',', '.') : text;
    const v = normal === '' ? Number.NaN : Number(normal);
    if (!Number.isFinite(v)) {
      fail('titration-value-invalid', `Row ${row + 1}: ${column} "${raw ?? ''}" is not a number.`, 'points');
    }
    return v;
  };
  const points: TitrationPoint[] = [];
  for (let r = 1; r < lines.length; r++) {
    const cells = splitRow(lines[r]!, sep);
    const ph = number(cells[iPh], r, 'ph');
    points.push(
      iVolume >= 0
        ? { volume_ml: number(cells[iVolume], r, 'volume_ml'), ph }
        : { counts: number(cells[iCounts], r, 'counts'), ph },
    );
  }
  return points;
}
