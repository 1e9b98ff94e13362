import { describe, expect, it } from 'vitest';
import { validateDoc } from '../../src/store/validate';
import { demoDocs } from '../../src/ui/demo';

describe('demo scenario', () => {
  it('is deterministic and every document is valid', () => {
    const a = demoDocs();
    expect(demoDocs()).toEqual(a);
    for (const d of a) validateDoc(d);
    const sites = a.filter((d) => d.type === 'site');
    expect(sites.length).toBeGreaterThanOrEqual(3);
    const readings = a.filter((d) => d.type === 'reading');
    expect(readings.length).toBeGreaterThan(300);
    for (const s of sites) expect(s.name).toMatch(/\(demo\)$/);
  });
});
