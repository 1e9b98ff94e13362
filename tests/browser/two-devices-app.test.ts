/**
 * Two phones of one team, each a separate browser context (its own IndexedDB and service worker),
 * sharing one CouchDB-API server through the built app: A makes a site and a reading and syncs;
 * B sets up the same server and database and sees the reading. Both then edit that reading while
 * offline, A the pH and B the notes; both sync. The phone that syncs second finds the conflict,
 * shows it in words (top-bar badge, Settings panel), and its user merges it field by field. After
 * a further sync both phones show the same reading, holding A's pH and B's notes.
 */

import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { CouchServer } from '../sync/couch-server';
import { ARTIFACTS, launch, newContext, openApp, screenshot } from './browser';
import { audit } from './phone-audit';

const base = inject('baseUrl');
const server = new CouchServer({ shared: true });
const DB = `tufa-pair-${process.pid}-${Date.now()}`;
const SITE = 'Otterbrook spring box';
let browser: Browser;
let ctxA: BrowserContext;
let ctxB: BrowserContext;
let a: Page;
let b: Page;

beforeAll(async () => {
  await server.start();
  await server.createDb(DB);
  browser = await launch();
  ctxA = await newContext(browser, { width: 390 });
  ctxB = await newContext(browser, { width: 390 });
  a = await ctxA.newPage();
  b = await ctxB.newPage();
});
afterAll(async () => {
  await browser?.close();
  await server.stop();
});

const badge = (p: Page) => p.getByTestId('sync-badge');
const syncPanel = (p: Page) => p.locator('section[aria-labelledby="sync-h"]');

async function setUpSharing(p: Page): Promise<void> {
  await p.getByRole('link', { name: 'Settings' }).click();
  await p.getByLabel('Server address').fill(server.url);
  await p.getByLabel('Database name').fill(DB);
  await p.getByLabel('Sign-in').selectOption('none');
  await p.getByRole('button', { name: 'Check and save' }).click();
  await expect.poll(() => syncPanel(p).textContent(), { timeout: 20_000 }).toContain('Up to date.');
}

async function syncNow(p: Page): Promise<void> {
  await p.getByRole('link', { name: 'Settings' }).click();
  await p.getByRole('button', { name: 'Sync now' }).click();
  await expect.poll(() => badge(p).textContent(), { timeout: 20_000 }).toMatch(/synced \d\d:\d\d$/);
  await expect.poll(() => p.getByRole('button', { name: 'Sync now' }).isEnabled()).toBe(true);
}

async function openTheReading(p: Page): Promise<void> {
  await p.getByRole('link', { name: 'Sites', exact: true }).click();
  await p.getByRole('link', { name: new RegExp(SITE) }).click();
  await p.getByRole('heading', { name: SITE }).waitFor();
  await p.locator('a[href^="#/reading/"]').first().click();
  await p.getByRole('heading', { name: 'Reading', exact: true }).waitFor();
}

/** The measured values and notes as the reading page shows them, for comparing two phones. */
async function readingShown(p: Page): Promise<string> {
  await openTheReading(p);
  const measured = (await p.locator('section[aria-labelledby="measured-h"]').textContent()) ?? '';
  return measured.replace(/\s+/g, ' ').trim();
}

async function serverReading(): Promise<Record<string, unknown> | undefined> {
  const r = await fetch(`${server.url}${DB}/_all_docs?include_docs=true&conflicts=true`);
  const body = (await r.json()) as { rows: { doc: Record<string, unknown> }[] };
  return body.rows.map((row) => row.doc).find((d) => d.type === 'reading');
}

describe('two phones share a log through the app', () => {
  it('A writes, B sees it; both edit offline; the conflict is shown in words, merged, and both agree', async () => {
    // Phone A: a site and a reading, then sharing.
    await openApp(a, base);
    await a.getByRole('link', { name: 'New site' }).click();
    await a.getByLabel('Name').fill(SITE);
    await a.getByLabel('Kind of water').selectOption('spring');
    await a.getByRole('button', { name: 'Save site' }).click();
    await a.getByRole('heading', { name: SITE }).waitFor();
    await a.getByRole('link', { name: 'New reading' }).click();
    await a.getByLabel('Temperature', { exact: true }).fill('9,4');
    await a.getByLabel('pH', { exact: true }).fill('7,12');
    await a.getByLabel('Alkalinity', { exact: true }).fill('3100');
    await a.getByRole('button', { name: 'Save reading' }).click();
    await a.getByRole('heading', { name: 'Reading', exact: true }).waitFor();
    await setUpSharing(a);
    await expect.poll(async () => (await serverReading())?.type).toBe('reading');

    // Phone B: same server and database; the reading arrives.
    await openApp(b, base);
    await setUpSharing(b);
    await b.getByRole('link', { name: 'Sites', exact: true }).click();
    await expect.poll(() => b.getByRole('link', { name: new RegExp(SITE) }).count()).toBe(1);
    const before = await readingShown(b);
    expect(before).toContain('7.12');
    expect(before).toBe(await readingShown(a));

    // Both offline; A changes the pH, B writes a note on the same reading.
    await ctxA.setOffline(true);
    await ctxB.setOffline(true);
    await a.getByRole('link', { name: 'Edit' }).click();
    await a.getByLabel('pH', { exact: true }).fill('7,31');
    await a.getByRole('button', { name: 'Save reading' }).click();
    await a.getByRole('heading', { name: 'Reading', exact: true }).waitFor();
    await b.getByRole('link', { name: 'Edit' }).click();
    await b.getByLabel('Notes').fill('Overflow weir silted; sampled at the pipe');
    await b.getByRole('button', { name: 'Save reading' }).click();
    await b.getByRole('heading', { name: 'Reading', exact: true }).waitFor();
    await expect.poll(() => a.getByTestId('sync-badge').textContent()).toContain('1 to send');
    await expect.poll(() => b.getByTestId('sync-badge').textContent()).toContain('1 to send');

    // A is back first and its edit lands; B comes back after and meets A's edit on the server.
    await ctxA.setOffline(false);
    await syncNow(a);
    await expect.poll(async () => JSON.stringify((await serverReading())?.values)).toContain('7.31');
    await ctxB.setOffline(false);
    await syncNow(b);

    // B: the badge and the panel say it in words; nothing B typed is gone while undecided.
    await expect.poll(() => badge(b).textContent(), { timeout: 20_000 }).toContain('1 conflict');
    // The user taps the badge from another screen and lands on the conflict, not on the units.
    await b.getByRole('link', { name: 'Sites', exact: true }).click();
    await badge(b).click();
    const panel = syncPanel(b);
    await expect.poll(() => panel.textContent()).toContain('Conflicts to decide (1)');
    expect(await panel.textContent()).toContain('A conflict needs your choice (below)');
    await expect
      .poll(() => b.evaluate(() => document.getElementById('conflicts-h')?.getBoundingClientRect().top ?? -1))
      .toBeLessThan(844);
    await expect.poll(() => panel.textContent()).toContain('Conflicts to decide (1)');
    const card = panel.locator('article[aria-label^="Conflict: Reading of"]');
    await expect.poll(() => card.textContent()).toContain('Changed on this device and on the server');
    const cardText = (await card.textContent()) ?? '';
    expect(cardText).toContain('pH 7.12'); // B's version still has the old pH…
    expect(cardText).toContain('pH 7.31'); // …the server has A's
    expect(cardText).toContain('Overflow weir silted; sampled at the pipe');
    await screenshot(b, '30a-two-phones-conflict-b-from-badge', { fullPage: false });
    await b.evaluate(() => window.scrollTo(0, 0));
    await screenshot(b, '30-two-phones-conflict-b');
    expect(await audit(b, 'conflict on phone B')).toEqual([]);
    await card.screenshot({ path: new URL('31-two-phones-conflict-card.png', ARTIFACTS).pathname });

    // The user on B merges: A's pH from the server, B's own notes.
    const valuesRow = card.locator('tr', { has: b.getByRole('rowheader', { name: 'Measured values' }) });
    await valuesRow.getByRole('radio').nth(1).check();
    const notesRow = card.locator('tr', { has: b.getByRole('rowheader', { name: 'Notes' }) });
    await expect(notesRow.getByRole('radio').nth(0).isChecked()).resolves.toBe(true);
    await card.getByRole('button', { name: 'Save the fields picked above' }).click();
    await expect.poll(() => panel.textContent()).not.toContain('Conflicts to decide (');
    await syncNow(b);
    await expect.poll(() => badge(b).textContent()).toMatch(/^synced/);
    await expect
      .poll(async () => (await serverReading())?.notes, { timeout: 20_000 })
      .toBe('Overflow weir silted; sampled at the pipe');
    const onServer = await serverReading();
    expect(JSON.stringify(onServer?.values)).toContain('7.31');
    expect(onServer?._conflicts ?? []).toEqual([]);

    // A pulls the merge; both phones show the same reading with both people's changes.
    await syncNow(a);
    await expect.poll(() => badge(a).textContent()).toMatch(/^synced/);
    // The badge may already read "synced" from an earlier sync in the same minute, so wait for
    // what A shows rather than for the badge.
    const shownB = await readingShown(b);
    expect(shownB).toContain('7.31');
    await expect.poll(() => readingShown(a), { timeout: 20_000 }).toBe(shownB);
    for (const p of [a, b]) {
      await p.getByRole('link', { name: 'Edit' }).click();
      await expect
        .poll(() => p.getByLabel('Notes').inputValue())
        .toBe('Overflow weir silted; sampled at the pipe');
      await expect.poll(() => p.getByLabel('pH', { exact: true }).inputValue()).toMatch(/^7[.,]31$/);
      await p.getByRole('link', { name: 'Cancel' }).click();
    }
    await screenshot(a, '32-two-phones-resolved-a');
  }, 180_000);
});
