import type { TitrationRecord } from '../../src/store/schema';
import raw from '../chem/titration/kestrel-hollow-spring.json';

/** The invented Kestrel Hollow spring titration (tests/chem/titration), as the app stores it. */
export const KESTREL: TitrationRecord = {
  sampleVolumeMl: raw.sample_volume_ml,
  titrantNormality: raw.titrant_normality,
  method: 'gran',
  points: raw.points.map((p) => ({ volumeMl: p.volume_ml, ph: p.ph })),
};
