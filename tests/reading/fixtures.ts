import { readFileSync } from 'node:fs';
import type { TitrationRecord } from '../../src/store/schema';

/** The invented Kestrel Hollow spring titration (tests/chem/titration), as the app stores it. */
const raw = JSON.parse(
  readFileSync(new URL('../chem/titration/kestrel-hollow-spring.json', import.meta.url), 'utf8'),
) as { sample_volume_ml: number; titrant_normality: number; points: { volume_ml: number; ph: number }[] };
export const KESTREL: TitrationRecord = {
  sampleVolumeMl: raw.sample_volume_ml,
  titrantNormality: raw.titrant_normality,
  method: 'gran',
  points: raw.points.map((p) => ({ volumeMl: p.volume_ml, ph: p.ph })),
};
