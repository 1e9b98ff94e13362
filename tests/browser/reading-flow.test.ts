/**
 * A user's first minutes: create a site, enter a reading (with a decimal comma), see the results
 * computed by the engine worker, save, reload: the reading is still there.
 */

import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { isSolveError } from '../../src/chem/api';
import { readingRequest } from '../../src/reading/request';
import type { SiteDoc } from '../../src/store/schema';
import { DEFAULT_SETTINGS } from '../../src/store/settings';
import { solve } from '../../src/ui/engine-source';
import { formatNumber } from '../../src/ui/numbers';
import { launch, newContext, openApp, screenshot } from './browser';

let browser: Browser;
let page: Page;
const base = inject('baseUrl');

beforeAll(async () => {
  browser = await launch();
  page = await (await newContext(browser)).newPage();
});
afterAll(async () => browser?.close());

describe('site and reading', () => {
  it('creates a site, computes as the user types, saves, and keeps the reading across a reload', async () => {
    await openApp(page, base);
    await screenshot(page, '01-sites-empty');
    await page.getByRole('link', { name: 'New site' }).click();
    await page.getByLabel('Name').fill('Saltmarsh holding tank');
    await page.getByLabel('Kind of water').selectOption('tank');
    await page.getByLabel('Water model').selectOption('saline');
    await page.getByLabel('Usual salinity (optional, PSS-78)').fill('35');
    await screenshot(page, '02-site-form');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByRole('heading', { name: 'Saltmarsh holding tank' }).waitFor();

    await page.getByRole('link', { name: 'New reading' }).click();
    await page.getByLabel('Temperature', { exact: true }).fill('25');
    await page.getByLabel('pH', { exact: true }).fill('8,05'); // decimal comma, as typed on many phones
    // A tank of sea water is a reef keeper's (dKH by default); this one is logged in µmol/kg.
    await page.getByLabel('Alkalinity unit').selectOption('umol_kg');
    await page.getByLabel('Alkalinity', { exact: true }).fill('2300');
    await expect.poll(() => page.getByLabel('Salinity', { exact: true }).inputValue()).toBe('35');

    // What the engine itself says for the same input, computed here in Node.
    const site = {
      id: 'x',
      type: 'site',
      name: 'x',
      kind: 'tank',
      notes: '',
      updatedAt: '',
      deleted: false,
      defaults: { model: 'saline', salinity: 35 },
    } as SiteDoc;
    const values = [
      { quantity: 'temperature', value: 25, unit: 'c' },
      { quantity: 'ph', value: 8.05, unit: 'ph' },
      { quantity: 'alkalinity', value: 2300, unit: 'umol_kg' },
      { quantity: 'salinity', value: 35, unit: 'pss' },
    ];
    const expected = solve(readingRequest({ values }, site, DEFAULT_SETTINGS).input);
    expect(isSolveError(expected), JSON.stringify(expected)).toBe(false);
    if (isSolveError(expected)) return;
    const dic = page.locator('.results .output[data-key="dic_umol_kg"] .value');
    await expect
      .poll(() => dic.textContent(), { timeout: 10_000 })
      .toBe(formatNumber(expected.dic_umol_kg, undefined, { digits: 4 }));
    await expect(page.locator('.results .caution').textContent()).resolves.toContain(
      'not a dosing instruction',
    );
    await screenshot(page, '03-reading-entry');

    await page.getByRole('button', { name: 'Save reading' }).click();
    await page.getByRole('heading', { name: 'Reading', exact: true }).waitFor();
    await page.locator('[data-testid="speciation"]').waitFor();
    // The reading page propagates the constants' and the pH reading's uncertainty to every output.
    const withU = solve({
      ...readingRequest({ values }, site, DEFAULT_SETTINGS).input,
      uncertainty: { constants: true, ph: 0.02 },
    });
    if (isSolveError(withU) || !withU.uncertainty?.dic_umol_kg) throw new Error('engine gave no uncertainty');
    const uDic = formatNumber(withU.uncertainty.dic_umol_kg.standard_uncertainty, undefined, { digits: 2 });
    await expect
      .poll(() => page.locator('.output[data-key="dic_umol_kg"] .uncertainty').textContent())
      .toContain(`± ${uDic}`);
    await screenshot(page, '04-reading-detail');

    // Planning is loaded on demand from the reading, and a plan shows its cautions.
    await page.getByRole('button', { name: /Plan a dose/ }).click();
    await page.getByRole('button', { name: 'Show the result' }).click();
    await page.getByRole('heading', { name: 'Cautions' }).waitFor({ timeout: 15_000 });
    await screenshot(page, '04b-plan-panel');
    await page.getByRole('button', { name: 'Save plan with this reading' }).click();
    // The saved plan shows on the reading page: what was planned and the predicted water.
    await page.getByTestId('saved-plan').waitFor();
    expect(await page.getByTestId('saved-plan-water').count()).toBe(1);
    const detailUrl = page.url();

    await page.reload();
    await page.waitForSelector('html[data-ready="true"]');
    expect(page.url()).toBe(detailUrl);
    await expect.poll(() => page.locator('.output .value').first().textContent()).toBe('25');
    await page.getByRole('link', { name: 'Saltmarsh holding tank' }).click();
    await expect.poll(() => page.locator('.log li').count()).toBe(1);
  });

  it('puts validity warnings beside the value they concern', async () => {
    await openApp(page, base);
    await page.getByRole('link', { name: /Saltmarsh holding tank/ }).click();
    await page.getByRole('link', { name: 'New reading' }).click();
    await page.getByLabel('Temperature', { exact: true }).fill('40'); // above the 2–35 °C of Lueker et al. 2000
    await page.getByLabel('pH', { exact: true }).fill('8.0');
    await page.getByLabel('Alkalinity unit').selectOption('umol_kg');
    await page.getByLabel('Alkalinity', { exact: true }).fill('2300');
    const tempRow = page.locator('.qrow', { has: page.getByLabel('Temperature', { exact: true }) });
    await expect
      .poll(() => tempRow.locator('.issue.warn').count(), { timeout: 10_000 })
      .toBeGreaterThanOrEqual(2);
    expect(await tempRow.textContent()).toContain('Lueker et al. 2000');
    // The salinity row (35) is inside every range: no warning there.
    const salRow = page.locator('.qrow', { has: page.getByLabel('Salinity', { exact: true }) });
    expect(await salRow.locator('.issue.warn').count()).toBe(0);
    await page.getByRole('link', { name: 'Cancel' }).click();
  });

  it('refuses a value that is not a number, with a code, and saves nothing', async () => {
    await openApp(page, base);
    await page.getByRole('link', { name: /Saltmarsh holding tank/ }).click();
    await page.getByRole('link', { name: 'New reading' }).click();
    await page.getByLabel('Temperature', { exact: true }).fill('12..5');
    await expect
      .poll(() => page.locator('.qmsg .issue.error').first().textContent())
      .toContain('input-not-a-number');
    expect(await page.locator('body').textContent()).not.toContain('NaN');
    await page.getByRole('button', { name: 'Save reading' }).click();
    await expect.poll(() => page.getByRole('alert').first().textContent()).toContain('input-not-a-number');
    await page.getByRole('link', { name: 'Cancel' }).click();
    await expect.poll(() => page.locator('.log li').count()).toBe(1);
  });
});
