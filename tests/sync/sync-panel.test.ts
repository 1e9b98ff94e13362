import { mkdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { inChromium } from '../bench/in-chromium';

describe('sync panel in Chromium', () => {
  it('shows status in words, the http warning, both versions of a conflict, and resolves it', async () => {
    mkdirSync('test-artifacts', { recursive: true });
    await inChromium(
      'tests/sync/sync-panel-entry.tsx',
      async (page) => {
        await page.waitForFunction(() => window.panelReady === true);
        await page.getByText('Conflicts to decide (1)').waitFor();
        const text = await page.textContent('body');
        expect(text).toContain('meter recalibrated before this one');
        expect(text).toContain('bubbles in the flow cell');
        expect(text).toContain('Temperature 9.4 °C; pH 7.21');
        expect(text).toContain('pH 7.25');
        expect(text).toContain('Reading of 3 Jun 2026, 09:15 (Europe/Vienna)');
        expect(text).toContain('plain http');
        expect(text).toMatch(
          /7c0e2a4e-0b7d-4c55-9d0e-3f1b2a9c8d11 \(revision 3-a41f\) from the server was set aside: value of ph is not a finite number/,
        );
        await page.getByRole('button', { name: 'Sync now' }).click();
        await page
          .getByText(/cannot be reached/)
          .first()
          .waitFor({ timeout: 20000 });
        await page.screenshot({ path: 'test-artifacts/sync-panel.png', fullPage: true });
        await page.getByRole('button', { name: 'Keep this device’s version' }).click();
        await page.getByText('Conflicts to decide (1)').waitFor({ state: 'detached' });
        expect(await page.textContent('body')).toContain('Waiting to be sent');
        await page.screenshot({ path: 'test-artifacts/sync-panel-resolved.png', fullPage: true });
      },
      { css: 'src/ui/styles.css' },
    );
  }, 60000);
});
