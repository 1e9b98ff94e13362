/**
 * Three people, three walks through the built app, on a 390×844 phone and a 1280×800 screen: a
 * hydrologist at a spring, a reef keeper, a pond manager. Each creates a site of their kind,
 * types their usual reading in their usual units (the form must offer those units by itself),
 * and must find the headline answers in those units with the values `solve()` gives in Node.
 * Every screen is audited (no NaN, nothing wider than the screen, no tap target under 44 px, no
 * engine name) and saved to test-artifacts/; the phone reading pages are also the README's
 * pictures in public/screenshots/ when TUFA_README_SHOTS=1.
 */

import { mkdirSync } from 'node:fs';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { isSolveError } from '../../src/chem/api';
import { plan } from '../../src/chem/plan/plan';
import { siteProfile } from '../../src/quantities';
import { readingRequest } from '../../src/reading/request';
import type { SiteDoc, SiteKind } from '../../src/store/schema';
import { DEFAULT_SETTINGS } from '../../src/store/settings';
import { solve } from '../../src/ui/engine-source';
import { airEquilibriumInput, degassingSentence, headlineRows } from '../../src/ui/headline';
import { formatNumber } from '../../src/ui/numbers';
import { launch, openApp, screenshot } from './browser';
import { audit, engineKeys, type Trouble } from './phone-audit';

const base = inject('baseUrl');
let browser: Browser;

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => browser?.close());

interface Walk {
  trade: string;
  site: string;
  kind: SiteKind;
  /** label, the unit the form must offer by itself, the value typed. */
  rows: [label: string, quantity: string, unit: string, typed: string][];
  /** Headline ids that must be there. */
  heads: string[];
}

// Invented sites and readings, in each trade's usual units.
const WALKS: Walk[] = [
  {
    trade: 'field',
    site: 'Hollow Ash spring',
    kind: 'spring',
    rows: [
      ['Temperature', 'temperature', 'c', '11.2'],
      ['pH', 'ph', 'ph', '7.21'],
      ['Alkalinity', 'alkalinity', 'meq_l', '4.6'],
      ['Specific conductance (25 °C)', 'conductance', 'us_cm', '612'],
      ['Calcium', 'calcium', 'mg_l', '95'],
    ],
    heads: ['pco2', 'log-pco2', 'co2-excess', 'si-calcite', 'dic-mmol-l', 'dic-mg-c-l', 'alkalinity-meq_l'],
  },
  {
    trade: 'aquarium',
    site: 'Lagoon reef tank',
    kind: 'reef',
    rows: [
      ['Temperature', 'temperature', 'c', '25.5'],
      ['pH', 'ph', 'ph', '8.05'],
      ['Alkalinity', 'alkalinity', 'dkh', '8.2'],
      ['Salinity', 'salinity', 'sg', '1.0264'],
      ['Calcium', 'calcium', 'mg_l', '420'],
      ['Magnesium', 'magnesium', 'mg_l', '1300'],
    ],
    heads: [
      'alkalinity-dkh',
      'calcium',
      'magnesium',
      'ph-meter',
      'omega-aragonite',
      'salinity',
      'specific-gravity',
    ],
  },
  {
    trade: 'aquaculture',
    site: 'Reedbed fish pond',
    kind: 'pond',
    rows: [
      ['Temperature', 'temperature', 'c', '22'],
      ['pH', 'ph', 'ph', '6.4'],
      ['Alkalinity', 'alkalinity', 'mg_l_caco3', '18'],
      ['Calcium', 'calcium', 'mg_l_caco3', '20'],
      ['Total ammonia', 'ammonia', 'mg_l_n', '0.5'],
    ],
    heads: ['alkalinity-mg_l_caco3', 'hardness', 'co2-mg-l'],
  },
];

const SIZES = [
  { name: 'phone', width: 390, height: 844, mobile: true },
  { name: 'desktop', width: 1280, height: 800, mobile: false },
];

async function look(p: Page, name: string, troubles: Trouble[]): Promise<void> {
  await screenshot(p, name);
  troubles.push(...(await audit(p, name)), ...(await engineKeys(p, name)));
}

for (const size of SIZES) {
  describe(`each trade's walk on a ${size.width}×${size.height} ${size.name}`, () => {
    for (const walk of WALKS) {
      it(`${walk.trade}: ${walk.site}`, async () => {
        const context: BrowserContext = await browser.newContext({
          locale: 'en-GB',
          timezoneId: 'Europe/Berlin',
          viewport: { width: size.width, height: size.height },
          hasTouch: size.mobile,
          isMobile: size.mobile,
          serviceWorkers: 'block',
        });
        const page = await context.newPage();
        const troubles: Trouble[] = [];
        const tag = `trade-${walk.trade}-${size.name}`;
        try {
          await openApp(page, base);
          // The engine-name check must see one when there is one.
          await page.evaluate(() => {
            const probe = document.createElement('p');
            probe.id = 'key-probe';
            probe.textContent = 'alkalinity_dkh (pKsp_calcite) CO2*';
            document.body.append(probe);
          });
          expect((await engineKeys(page, 'probe')).map((t) => t.what)).toEqual([
            'shows the engine name “alkalinity_dkh”',
            'shows the engine name “pKsp”',
            'shows the engine name “CO2*”',
          ]);
          await page.evaluate(() => document.getElementById('key-probe')?.remove());
          await page.getByRole('link', { name: 'New site' }).click();
          await page.getByLabel('Name').fill(walk.site);
          await page.getByLabel('Kind of water').selectOption(walk.kind);
          await expect
            .poll(() => page.getByLabel('Trade (sets units, answers and cautions)').inputValue())
            .toBe(walk.trade);
          await look(page, `${tag}-1-site`, troubles);
          await page.getByRole('button', { name: 'Save site' }).click();
          await page.getByRole('heading', { name: walk.site }).waitFor();
          await page.getByRole('link', { name: 'New reading' }).click();

          // The form starts with this trade's quantities, each in this trade's unit.
          for (const [label, , unit, typed] of walk.rows) {
            const input = page.getByLabel(label, { exact: true });
            await input.waitFor();
            const unitBox = page.getByLabel(`${label} unit`);
            if (await unitBox.count()) expect(await unitBox.inputValue(), label).toBe(unit);
            await input.fill(typed);
          }
          const values = walk.rows.map(([, quantity, unit, typed]) => ({
            quantity,
            unit,
            value: Number(typed),
          }));
          const site = { kind: walk.kind, defaults: { model: 'auto' } } as unknown as SiteDoc;
          const profile = siteProfile(site);
          const request = readingRequest({ values }, site, DEFAULT_SETTINGS).input;
          const expected = solve(request);
          if (isSolveError(expected)) throw new Error(JSON.stringify(expected.error));
          const record = expected as unknown as Record<string, unknown>;
          const alkUnit = values.find((v) => v.quantity === 'alkalinity')!.unit;
          const heads = headlineRows(profile, record, values, alkUnit);
          expect(heads.map((h) => h.id)).toEqual(expect.arrayContaining(walk.heads));
          const shown = (id: string) => page.locator(`.results [data-head="${id}"] .value`).textContent();
          for (const h of heads) {
            const text = formatNumber(
              h.value,
              'en-GB',
              h.decimals !== undefined ? { decimals: h.decimals } : { digits: h.digits ?? 3 },
            );
            const want = h.signed && h.value > 0 ? `+${text}` : text;
            await expect.poll(() => shown(h.id), { timeout: 15_000 }).toBe(want);
            expect(
              (await page.locator(`.results [data-head="${h.id}"] .unit`).count())
                ? await page.locator(`.results [data-head="${h.id}"] .unit`).textContent()
                : '',
            ).toBe(h.unit ? ` ${h.unit}` : '');
          }
          if (walk.trade === 'field') {
            const air = solve(airEquilibriumInput(request, record, DEFAULT_SETTINGS.atmospheric_pco2_uatm)!);
            if (isSolveError(air)) throw new Error(JSON.stringify(air.error));
            const sentence = degassingSentence(record, air as unknown as Record<string, unknown>, (x, d) =>
              formatNumber(x, 'en-GB', { decimals: d }),
            );
            expect(sentence).toMatch(
              /would reach pH \d\.\d and SI calcite \+\d\.\d: expect calcite to precipitate downstream\.$/,
            );
            await expect.poll(() => page.locator('.results .degassing').textContent()).toBe(sentence);
            // No fish at a spring.
            expect(await page.locator('.results').textContent()).not.toMatch(/fish|coral|species/i);
          } else {
            expect(await page.locator('.results .caution').textContent()).toContain(
              'not a dosing instruction',
            );
          }
          await look(page, `${tag}-2-entry`, troubles);
          if (size.name === 'desktop' && walk.trade === 'field' && process.env.TUFA_README_SHOTS) {
            // The README's "results as you type" picture, refreshed with the headline.
            if (await page.locator('.toast button').count())
              await page.locator('.toast button').first().click();
            await page.screenshot({
              path: new URL('../../public/screenshots/reading-wide.png', import.meta.url).pathname,
            });
          }

          await page.getByRole('button', { name: 'Save reading' }).click();
          await page.getByRole('heading', { name: 'Reading', exact: true }).waitFor();
          await expect.poll(() => shown(heads[0]!.id), { timeout: 15_000 }).not.toBeNull();
          await page.locator('[data-testid="speciation"]').waitFor();
          await page.evaluate(() => window.scrollTo(0, 0));
          await look(page, `${tag}-3-reading`, troubles);
          // Everything behind "All outputs" and the constants too, opened.
          await page.evaluate(() => {
            for (const d of document.querySelectorAll('details')) d.open = true;
          });
          await look(page, `${tag}-3b-reading-open`, troubles);
          if (size.name === 'phone' && process.env.TUFA_README_SHOTS) {
            // The README's picture: what the phone shows first, the answers under the reading.
            mkdirSync(new URL('../../public/screenshots/', import.meta.url), { recursive: true });
            if (await page.locator('.toast button').count())
              await page.locator('.toast button').first().click();
            await page.locator('section[aria-labelledby="computed-h"]').scrollIntoViewIfNeeded();
            await page.evaluate(() => window.scrollBy(0, -140));
            await page.screenshot({
              path: new URL(`../../public/screenshots/reading-${walk.trade}.png`, import.meta.url).pathname,
            });
            await page.evaluate(() => window.scrollTo(0, 0));
          }

          // Each trade's usual plan: aerate the spring, dose the reef, lime the pond by area and depth.
          await page.getByRole('button', { name: /Plan a dose/ }).click();
          const what = page.getByLabel('What to do');
          await what.waitFor();
          if (walk.trade === 'field') await what.selectOption('equilibrate');
          if (walk.trade === 'aquarium') await page.getByLabel('Target value').fill('9');
          if (walk.trade === 'aquaculture') {
            // A select's accessible name includes its chosen option: find each by what it offers.
            await page
              .locator('select:has(option[value="calcium_carbonate"])')
              .selectOption('calcium_carbonate');
            await page
              .locator('select:has(option[value="omega_aragonite"])')
              .selectOption('alkalinity_mg_l_caco3');
            await page.getByLabel('Target value').fill('50');
            await page.getByLabel('Pond area (m²)').fill('9600');
            await page.getByLabel('Mean depth (m)').fill('1.5');
          }
          await page.getByRole('button', { name: 'Show the result' }).click();
          await page.getByRole('heading', { name: 'Cautions' }).waitFor({ timeout: 15_000 });
          const planText = (await page.locator('section[aria-labelledby="plan-title"]').textContent()) ?? '';
          if (walk.trade === 'field') {
            expect(planText).not.toMatch(/bucket|fish|coral|Limits for animals/i);
          }
          if (walk.trade === 'aquaculture') {
            // 9600 m² × 1.5 m = 14 400 m³; a rate per hectare, a mass in kg or t, never in grams.
            expect(planText).toContain('14,400 m³');
            expect(planText).toMatch(/kg\/ha/);
            expect(planText).not.toMatch(/\d g into/);
            // The same plan in Node: limestone stops where the engine says.
            const req = {
              water: readingRequest({ values }, site, DEFAULT_SETTINGS).input,
              volume_l: 14_400_000,
              trade: 'aquaculture',
              actions: [
                {
                  action: 'reach',
                  chemical: 'calcium_carbonate',
                  target: { alkalinity_mg_l_caco3: 50 },
                  purity_percent: 100,
                  max_ph_step: 0.2,
                  max_alkalinity_step_umol_kg: undefined,
                },
              ],
            };
            expect('error' in plan(req)).toBe(false);
          }
          expect(planText).not.toContain('Calcium 0 0 0');
          expect(planText).not.toMatch(/e-1\d/);
          await look(page, `${tag}-4-plan`, troubles);

          await page.getByRole('link', { name: walk.site }).first().click();
          await page.getByRole('heading', { name: walk.site }).waitFor();
          await look(page, `${tag}-5-site`, troubles);
        } finally {
          await context.close();
        }
        expect(troubles).toEqual([]);
      }, 120_000);
    }
  });
}
