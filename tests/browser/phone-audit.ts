/**
 * What a user trips over on the screen shown: NaN or "undefined" in the text, a page wider than
 * the phone, tap targets under 44 px high (common practice for touch screens) or past the edge.
 */

import type { Page } from 'playwright-core';

export interface Trouble {
  screen: string;
  what: string;
}

/** What a user would trip over on the current screen, in words. */
export async function audit(p: Page, screen: string): Promise<Trouble[]> {
  const found = await p.evaluate(() => {
    const out: string[] = [];
    // biome-ignore lint/performance/useDomNodeTextContent: only text a person can see counts here
    const text = document.body.innerText;
    for (const bad of ['NaN', 'undefined', 'null', 'Infinity', '[object'])
      if (new RegExp(`(^|[^\\w])${bad.replace('[', '\\[')}([^\\w]|$)`).test(text)) out.push(`shows “${bad}”`);
    const vw = document.documentElement.clientWidth;
    if (document.documentElement.scrollWidth > vw + 1)
      out.push(`page is ${document.documentElement.scrollWidth} px wide on a ${vw} px screen`);
    const targets = document.querySelectorAll<HTMLElement>(
      'button, a.button, nav a, .sync-badge, select, input:not([type=radio]):not([type=checkbox]):not([type=file]), textarea, label.check, label.pick',
    );
    for (const el of targets) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 || r.height === 0) continue;
      if (getComputedStyle(el).visibility === 'hidden') continue;
      const name = (el.getAttribute('aria-label') ?? el.textContent ?? el.tagName).trim().slice(0, 40);
      if (r.height < 43.5)
        out.push(`${el.tagName.toLowerCase()} “${name}” is ${Math.round(r.height)} px high`);
      if (r.right > vw + 1) out.push(`${el.tagName.toLowerCase()} “${name}” runs past the right edge`);
    }
    return out;
  });
  return found.map((what) => ({ screen, what }));
}

/**
 * Engine names a user should never read: snake_case keys (`alkalinity_dkh`, `volume_l`), the
 * ASCII species names of the engine (`CO2*`, `HCO3-`, `CO3--`, `pCO2/fCO2`), `pKsp`. Issue codes
 * are kebab-case and stay; text in form fields is the user's own and is not read.
 */
export async function engineKeys(p: Page, screen: string): Promise<Trouble[]> {
  const found = await p.evaluate(() => {
    // biome-ignore lint/performance/useDomNodeTextContent: only text a person can see counts here
    const text = document.body.innerText;
    const hits = new Set<string>();
    for (const m of text.matchAll(/\b[a-z][a-z0-9]*(?:_[a-z0-9]+)+\b/g)) hits.add(m[0]);
    for (const m of text.matchAll(/CO2\*|HCO3-|CO3--|pCO2\/fCO2|pKsp/g)) hits.add(m[0]);
    return [...hits];
  });
  return found.map((k) => ({ screen, what: `shows the engine name “${k}”` }));
}
