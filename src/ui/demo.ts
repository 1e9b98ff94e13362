/**
 * The Demo scenario: invented sites with one season of readings, generated deterministically
 * (same seed, same data) so screenshots and tests are repeatable. Nothing here is a measurement.
 */

import type { ReadingDoc, SiteDoc } from '../store/schema';

/** mulberry32: a small, well-known 32-bit PRNG; plenty for demo noise. */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function round(v: number, d: number): number {
  const f = 10 ** d;
  return Math.round(v * f) / f;
}

export const DEMO_PREFIX = 'demo-';

interface Scenario {
  site: Omit<SiteDoc, 'updatedAt' | 'deleted' | 'type'>;
  /** Readings every `stepH` hours over the season, local zone. */
  stepH: number;
  timeZone: string;
  sample: (day: number, r: () => number) => ReadingDoc['values'];
}

const SEASON_START = Date.parse('2026-04-01T07:00:00Z');
const SEASON_DAYS = 150;

const SCENARIOS: Scenario[] = [
  {
    site: {
      id: `${DEMO_PREFIX}site-quarrymill-spring`,
      name: 'Quarrymill spring (demo)',
      kind: 'spring',
      location: { latitude: 47.812, longitude: 11.204, source: 'typed' },
      defaults: { model: 'fresh', ph_scale: 'nbs', units: { alkalinity: 'mg_l_caco3' } },
      notes: 'Invented karst spring for the demo: cold, hard, CO₂-rich water that degasses downstream.',
    },
    stepH: 72,
    timeZone: 'Europe/Berlin',
    sample: (day, r) => [
      {
        quantity: 'temperature',
        value: round(8.6 + 0.8 * Math.sin((day / 150) * Math.PI) + 0.1 * r(), 1),
        unit: 'c',
      },
      { quantity: 'ph', value: round(7.05 + 0.08 * Math.sin(day / 9) + 0.04 * (r() - 0.5), 2), unit: 'ph' },
      {
        quantity: 'alkalinity',
        value: round(262 - 10 * Math.sin((day / 150) * Math.PI) + 6 * (r() - 0.5), 0),
        unit: 'mg_l_caco3',
      },
      { quantity: 'conductance', value: round(585 + 30 * (r() - 0.5), 0), unit: 'us_cm' },
      { quantity: 'calcium', value: round(96 + 4 * (r() - 0.5), 1), unit: 'mg_l' },
    ],
  },
  {
    site: {
      id: `${DEMO_PREFIX}site-heronmere-station`,
      name: 'Heronmere lake, buoy 2 (demo)',
      kind: 'lake',
      defaults: { model: 'fresh', ph_scale: 'nbs', units: { alkalinity: 'meq_l' } },
      notes: 'Invented eutrophic lake station: pH climbs with summer photosynthesis.',
    },
    stepH: 24,
    timeZone: 'Europe/London',
    sample: (day, r) => {
      const summer = Math.sin((day / 150) * Math.PI);
      return [
        { quantity: 'temperature', value: round(9 + 13 * summer + 1.2 * (r() - 0.5), 1), unit: 'c' },
        { quantity: 'ph', value: round(7.6 + 1.1 * summer + 0.15 * (r() - 0.5), 2), unit: 'ph' },
        { quantity: 'alkalinity', value: round(1.9 - 0.25 * summer + 0.05 * (r() - 0.5), 2), unit: 'meq_l' },
        { quantity: 'conductance', value: round(310 + 20 * (r() - 0.5), 0), unit: 'us_cm' },
      ];
    },
  },
  {
    site: {
      id: `${DEMO_PREFIX}site-garage-reef`,
      name: 'Garage reef tank (demo)',
      kind: 'reef',
      defaults: { model: 'saline', ph_scale: 'nbs', salinity: 35, units: { alkalinity: 'dkh' } },
      notes: 'Invented 600 L reef tank; alkalinity drifts down between weekly top-ups.',
    },
    stepH: 24,
    timeZone: 'America/Halifax',
    sample: (day, r) => [
      { quantity: 'temperature', value: round(25.4 + 0.4 * (r() - 0.5), 1), unit: 'c' },
      { quantity: 'salinity', value: round(34.8 + 0.4 * (r() - 0.5), 1), unit: 'pss' },
      {
        quantity: 'ph',
        value: round(8.12 + 0.06 * Math.sin((day * 2 * Math.PI) / 7) + 0.03 * (r() - 0.5), 2),
        unit: 'ph',
      },
      { quantity: 'alkalinity', value: round(8.4 - 0.12 * (day % 7) + 0.1 * (r() - 0.5), 2), unit: 'dkh' },
    ],
  },
];

export function demoDocs(
  now: Date = new Date(SEASON_START + SEASON_DAYS * 86400e3),
): (SiteDoc | ReadingDoc)[] {
  const stamp = now.toISOString();
  const out: (SiteDoc | ReadingDoc)[] = [];
  SCENARIOS.forEach((sc, si) => {
    out.push({ ...sc.site, type: 'site', updatedAt: stamp, deleted: false });
    const r = rng(1000 + si);
    for (let h = 0, n = 0; h < SEASON_DAYS * 24; h += sc.stepH, n++) {
      const t = SEASON_START + h * 3600e3 + Math.floor(r() * 90) * 60e3;
      out.push({
        id: `${DEMO_PREFIX}${si}-${n}`,
        type: 'reading',
        siteId: sc.site.id,
        takenAt: new Date(t).toISOString(),
        timeZone: sc.timeZone,
        values: sc.sample(h / 24, r),
        notes: '',
        updatedAt: stamp,
        deleted: false,
      });
    }
  });
  return out;
}
