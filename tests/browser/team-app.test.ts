/**
 * A team member in the built app against `tufa server`: the sync panel says who is signed in and
 * what the role allows; the lead's site and reading show who entered them, with a line instead of
 * the actions a member cannot do; a change the server refuses is a plain message and a conflict the
 * member resolves (keep it on the device, send again, or take the server's version).
 */

import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { main } from '../../src/cli/main';
import { readingInput, siteInput } from '../sync/devices';
import { basic } from '../team/team-devices';
import { TufaServer } from '../team/tufa-server';
import { ARTIFACTS, launch, newContext, openApp, screenshot } from './browser';
import { injectAppModules } from './bundle';
import { audit } from './phone-audit';

const base = inject('baseUrl');
const ADMIN = 'root:field-admin-pass';
const server = new TufaServer(ADMIN, 'team');
let browser: Browser;
let page: Page;
const T = '2026-05-02T10:00:00.000Z';
const quiet = { stdin: process.stdin, stdout: { write: () => true }, stderr: { write: () => true } };

beforeAll(async () => {
  await server.start();
  for (const [name, role] of [
    ['anna', 'member'],
    ['lea', 'lead'],
  ] as const)
    await main(
      [
        'team',
        'add-user',
        '--url',
        server.url,
        '--admin',
        ADMIN,
        '--name',
        name,
        '--password',
        `${name}-pw`,
        '--role',
        role,
      ],
      quiet,
    );
  const put = (doc: Record<string, unknown>) =>
    fetch(`${server.url}team/${doc._id}`, {
      method: 'PUT',
      headers: basic('lea', 'lea-pw'),
      body: JSON.stringify(doc),
    });
  const by = { updatedAt: T, deleted: false, created_by: 'lea', changed_by: 'lea' };
  expect(
    (await put({ _id: 'site-lea', type: 'site', ...siteInput('Weir pool below the mill'), ...by })).status,
  ).toBe(201);
  expect(
    (await put({ _id: 'reading-lea', type: 'reading', ...readingInput('site-lea', 2), ...by })).status,
  ).toBe(201);
  browser = await launch();
  page = await (await newContext(browser)).newPage();
}, 120000);
afterAll(async () => {
  await browser?.close();
  await server.stop();
});

describe('a member of a team in the app', () => {
  it('sees the role, who entered what, what they cannot change, and a plain refusal', async () => {
    await openApp(page, base);
    await page.getByRole('link', { name: 'Settings' }).click();
    const sync = page.locator('section[aria-labelledby="sync-h"]');
    await page.getByLabel('Server address').fill(server.url);
    await page.getByLabel('Database name').fill('team');
    await page.getByLabel('Sign-in').selectOption('basic');
    await page.getByLabel('User name').fill('anna');
    await page.getByLabel('Password', { exact: true }).fill('anna-pw');
    await page.getByRole('button', { name: 'Check and save' }).click();
    await expect.poll(() => sync.textContent(), { timeout: 20_000 }).toContain('Up to date.');
    await expect
      .poll(() => sync.locator('.team-role').textContent())
      .toBe(
        'Signed in as anna · member: adds sites and readings; changes or deletes only what they entered.',
      );
    await screenshot(page, 'team-signed-in');

    await page.getByRole('link', { name: 'Sites', exact: true }).first().click();
    await page.getByRole('link', { name: /Weir pool below the mill/ }).click();
    await page.getByRole('heading', { name: 'Weir pool below the mill' }).waitFor();
    await expect
      .poll(() => page.locator('.team-refusal').first().textContent())
      .toBe('Only lea or a lead can change or delete this site: as a member you change what you entered.');
    expect(await page.getByRole('link', { name: 'Edit site' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Delete site' }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'New reading' }).count()).toBe(1); // a member adds readings
    await page.locator('.log li a').first().click();
    await page.getByRole('heading', { name: 'Reading', exact: true }).waitFor();
    await expect.poll(() => page.getByText('Entered by lea').count()).toBe(1);
    expect(await page.getByRole('link', { name: 'Edit', exact: true }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Delete reading' }).count()).toBe(0);
    expect(await page.getByRole('link', { name: 'Another reading here' }).count()).toBe(1);
    await screenshot(page, 'team-member-reading');

    // A change made anyway (an older app, or before the role was known) is refused by the server:
    // said in plain words, and kept on this device, waiting.
    await injectAppModules(page);
    await page.evaluate(async () => {
      type M = typeof import('../bench/browser-entry');
      const repo = await (window as unknown as { TufaModules: M }).TufaModules.openRepository();
      await repo.updateReading('reading-lea', { notes: 'anna was here' });
      repo.close();
    });
    await page.getByRole('link', { name: 'Settings' }).click();
    await page.getByRole('button', { name: 'Sync now' }).click();
    await expect
      .poll(() => sync.textContent(), { timeout: 20_000 })
      .toMatch(
        /The server did not accept your change to this reading: A member changes or deletes only what they created; reading reading-lea was created by lea\. Ask a lead\. Your change is kept on this device.*sync-doc-forbidden/,
      );
    // A conflict to resolve, with the server's reason; out of the outbox, so not sent at every sync.
    const card = sync.locator('article.refused');
    await expect.poll(() => card.count()).toBe(1);
    expect(await card.textContent()).toMatch(/was created by lea\. Ask a lead\./);
    expect(await card.textContent()).toMatch(/This deviceServer.*anna was herereading 2/);
    expect(await sync.textContent()).toMatch(/Waiting to be sent0 changes/);
    await page.setViewportSize({ width: 390, height: 844 });
    await card.scrollIntoViewIfNeeded();
    expect(await audit(page, 'refused change')).toEqual([]);
    await screenshot(page, 'team-refused');
    await sync.screenshot({ path: new URL('team-refused-panel.png', ARTIFACTS).pathname });
    const serverNotes = async () =>
      (
        (await (
          await fetch(`${server.url}team/reading-lea`, { headers: basic('lea', 'lea-pw') })
        ).json()) as {
          notes: string;
        }
      ).notes;
    const localNotes = () =>
      page.evaluate(async () => {
        type M = typeof import('../bench/browser-entry');
        const repo = await (window as unknown as { TufaModules: M }).TufaModules.openRepository();
        const r = await repo.getReading('reading-lea');
        repo.close();
        return r?.notes;
      });
    expect(await serverNotes()).toBe('reading 2');

    // Keep it on this device only: listed as such, unsent, the edit still here.
    await card.getByRole('button', { name: 'Keep mine on this device only' }).click();
    const held = sync.locator('section[aria-labelledby="held-h"]');
    await expect.poll(() => held.textContent()).toMatch(/Kept on this device only \(1\)/);
    expect(await card.count()).toBe(0);
    expect(await localNotes()).toBe('anna was here');
    expect(await audit(page, 'kept on this device')).toEqual([]);
    await held.screenshot({ path: new URL('team-refused-held.png', ARTIFACTS).pathname });

    // Send again: still a member, so refused again and back as a conflict.
    await held.getByRole('button', { name: 'Send again' }).click();
    await expect.poll(() => card.count(), { timeout: 20_000 }).toBe(1);
    expect(await held.count()).toBe(0);

    // Take the server's version: the edit is dropped, the reading is the server's copy.
    await card.getByRole('button', { name: /Use the server’s version/ }).click();
    await expect.poll(() => card.count(), { timeout: 20_000 }).toBe(0);
    expect(await localNotes()).toBe('reading 2');
    expect(await serverNotes()).toBe('reading 2');
    await page.setViewportSize({ width: 1100, height: 900 });
  });

  it('a new phone fetches only the sites it chooses', async () => {
    const by = { updatedAt: T, deleted: false, created_by: 'lea', changed_by: 'lea' };
    const docs: Record<string, unknown>[] = [];
    for (const n of [1, 2, 3]) {
      docs.push({ _id: `pond-${n}`, type: 'site', ...siteInput(`Carp pond ${n}`), ...by });
      for (let i = 0; i < 5; i++)
        docs.push({ _id: `pond-${n}-r${i}`, type: 'reading', ...readingInput(`pond-${n}`, i), ...by });
    }
    const r = await fetch(`${server.url}team/_bulk_docs`, {
      method: 'POST',
      headers: basic('lea', 'lea-pw'),
      body: JSON.stringify({ docs }),
    });
    expect(r.status).toBe(201);

    const phone = await (await newContext(browser)).newPage();
    await openApp(phone, base);
    await phone.getByRole('link', { name: 'Settings' }).click();
    const sync = phone.locator('section[aria-labelledby="sync-h"]');
    await phone.getByLabel('Server address').fill(server.url);
    await phone.getByLabel('Database name').fill('team');
    await phone.getByLabel('Sign-in').selectOption('basic');
    await phone.getByLabel('User name').fill('anna');
    await phone.getByLabel('Password', { exact: true }).fill('anna-pw');
    await phone.getByLabel(/Fetch only the sites I choose/).check();
    await phone.getByRole('button', { name: 'Check and save' }).click();
    await expect.poll(() => sync.textContent(), { timeout: 20_000 }).toContain('Up to date.');
    const keep = phone.locator('form[aria-labelledby="keep-h"]');
    await keep.getByLabel('Carp pond 2').check();
    await keep.getByRole('button', { name: 'Keep 1 site' }).click();
    await expect.poll(() => sync.textContent(), { timeout: 20_000 }).toContain('Up to date.');
    await screenshot(phone, 'team-keep-sites');
    await injectAppModules(phone);
    const held = async () =>
      phone.evaluate(async () => {
        type M = typeof import('../bench/browser-entry');
        const repo = await (window as unknown as { TufaModules: M }).TufaModules.openRepository();
        const readings = (await repo.listAllReadings()).map((x) => x.siteId);
        const sites = (await repo.listSites()).length;
        repo.close();
        return { readings: [...new Set(readings)], count: readings.length, sites };
      });
    await expect.poll(async () => (await held()).count, { timeout: 20_000 }).toBe(5);
    expect(await held()).toEqual({ readings: ['pond-2'], count: 5, sites: 4 });
  });
});
