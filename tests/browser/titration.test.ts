/**
 * A field titration typed into a reading: reduced in the worker as the user types, its alkalinity
 * feeding the results, the raw points stored with the reading and reduced again on its page.
 * Points: the invented Kestrel Hollow spring titration of the titration tests.
 */

import { readFileSync } from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { isSolveError } from '../../src/chem/api';
import { freshTitrationConstants } from '../../src/chem/titration/reduceTitration';
import { titrate } from '../../src/chem/titration/titrate';
import { DEFAULT_TITRATION_METHOD, type TitrationInput } from '../../src/chem/titration/types';
import { readingRequest } from '../../src/reading/request';
import type { SiteDoc } from '../../src/store/schema';
import { DEFAULT_SETTINGS } from '../../src/store/settings';
import { solve } from '../../src/ui/engine-source';
import { formatNumber } from '../../src/ui/numbers';
import { launch, newContext, openApp, screenshot } from './browser';

const record = JSON.parse(
  readFileSync(new URL('../chem/titration/kestrel-hollow-spring.json', import.meta.url), 'utf8'),
) as TitrationInput & { points: { volume_ml: number; ph: number }[] };

let browser: Browser;
let page: Page;
const base = inject('baseUrl');

beforeAll(async () => {
  browser = await launch();
  page = await (await newContext(browser, { locale: 'de-DE' })).newPage();
});
afterAll(async () => browser?.close());

describe('field titration in a reading', () => {
  it('reduces the points, uses the alkalinity for the results, and keeps the raw points', async () => {
    const expected = titrate({ ...record, method: DEFAULT_TITRATION_METHOD }, freshTitrationConstants);
    if ('error' in expected) throw new Error(expected.error.message);
    const site = {
      id: 'x',
      type: 'site',
      name: 'x',
      kind: 'spring',
      notes: '',
      updatedAt: '',
      deleted: false,
      defaults: { model: 'fresh' },
    } as SiteDoc;
    const values = [
      { quantity: 'temperature', value: record.temperature_c, unit: 'c' },
      { quantity: 'ph', value: record.points[0]!.ph, unit: 'ph' },
      { quantity: 'conductance', value: 480, unit: 'us_cm' },
    ];
    const solved = solve({
      ...readingRequest({ values }, site, DEFAULT_SETTINGS).input,
      alkalinity_meq_l: expected.alkalinity_meq_l,
      // The default reduction gives DIC too, and the reading uses it (src/reading/request.ts).
      ...(expected.dic_umol_kg === undefined ? {} : { dic_umol_kg: expected.dic_umol_kg }),
    });
    if (isSolveError(solved)) throw new Error(solved.error.message);

    await openApp(page, base);
    await page.getByRole('link', { name: 'New site' }).click();
    await page.getByLabel('Name').fill('Kestrel Hollow spring');
    await page.getByLabel('Kind of water').selectOption('spring');
    await page.getByLabel('Water model').selectOption('fresh');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: 'Kestrel Hollow spring' }).waitFor();
    await page.getByRole('link', { name: 'New reading' }).click();
    await page
      .getByLabel('Temperature', { exact: true })
      .fill(String(record.temperature_c).replace('.', ','));
    await page.getByLabel('pH', { exact: true }).fill(String(record.points[0]!.ph).replace('.', ','));
    await page.getByLabel('Specific conductance (25 °C)', { exact: true }).fill('480');
    await page.getByText('Field titration (optional)').click();
    await page.getByLabel('Sample volume (mL)').fill('50');
    await page.getByLabel('Acid normality (eq/L)').fill('0,16');
    // Pasted from a German spreadsheet: tab-separated, decimal commas.
    await page
      .getByLabel('Points: acid added (mL) and pH, one pair per line')
      .fill(
        record.points
          .map((p) => `${String(p.volume_ml).replace('.', ',')}\t${String(p.ph).replace('.', ',')}`)
          .join('\n'),
      );

    const alk = page.locator('[data-key="titration-alkalinity"] .value');
    await expect
      .poll(() => alk.textContent(), { timeout: 15_000 })
      .toBe(formatNumber(expected.alkalinity_meq_l, 'de-DE', { digits: 4 }));
    const dic = page.locator('.results .output[data-key="dic_umol_kg"] .value');
    await expect.poll(() => dic.textContent()).toBe(formatNumber(solved.dic_umol_kg, 'de-DE', { digits: 4 }));
    expect(await page.locator('.titration .caution').textContent()).toContain('protective eyewear');
    await screenshot(page, '13-titration-entry');

    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByRole('heading', { name: 'Titration' }).waitFor();
    await page.reload();
    await page.waitForSelector('html[data-ready="true"]');
    await expect
      .poll(() => page.locator('[data-key="titration-alkalinity"] .value').textContent(), { timeout: 15_000 })
      .toBe(formatNumber(expected.alkalinity_meq_l, 'de-DE', { digits: 4 }));
    expect(await page.getByText(`${record.points.length} points`).count()).toBe(1);
  });
});
