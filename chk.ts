import { freshConstants } from './src/chem/fresh/constants';
import * as ix from './src/chem/fresh/indices';
import { solvePair } from './src/chem/solver/pairs';
const k = freshConstants({ temperatureC: 25, salinity: 0, pressureDbar: 0 }, { ionicStrength: 0.0125 });
const t = { phosphate: 0, silicate: 0, ammonia: 0, sulfide: 0 };
const ta = 3e-3; // 150 mg/L as CaCO3
const ca = 2e-3; // 200 mg/L as CaCO3
const [s] = solvePair('ph', 7.5, 'ta', ta, k, t);
console.log(s);
const phs = ix.phSaturationCalcite(ta, ca, k, t)!;
console.log('phs', phs, 'LSI', 7.5 - phs);
// Langelier classic
const hco3 = s!.hco3;
console.log('classic pHs', -Math.log10(k.k2) + Math.log10(k.kspCalcite) - Math.log10(ca) - Math.log10(hco3));
// Carrier-type simplified
const A = (Math.log10(500) - 1) / 10, B = -13.12 * Math.log10(298.15) + 34.55, C = Math.log10(200) - 0.4, D = Math.log10(150);
console.log('simplified pHs', 9.3 + A + B - C - D);
console.log('SI calcite', ix.saturationIndex(ca * s!.co3, k.kspCalcite));
const p = ix.precipitationPotentialCalcite(ta, s!.dic, ca, s!.h, k, t);
console.log('ccpp', p, p.molKg * 100.0869e3, 'mg/L');
const a = ix.phAtAirEquilibrium(ta, 420e-6, k, t);
console.log('air', -Math.log10(a.h), a.dic);
