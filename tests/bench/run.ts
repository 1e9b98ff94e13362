/**
 * The data benchmarks (CSV import in Chromium, first sync to pouchdb-server). `npm run bench`
 * runs the engine's benchmarks (`engine.ts`, bundled), then this, then the browser benchmarks.
 * Every benchmark prints figures and never fails on them; record the figures in the README.
 */

import { benchData } from './data';

console.log('\n## Data: CSV import (100 000 rows) and first sync (10 000 readings)');
for (const line of await benchData()) console.log(line);
