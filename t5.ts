import { reduceTitration } from './src/chem/titration/reduceTitration';
import { GRID, gridTitration, makerFor } from './tests/chem/titration/activityTitration';
for (const model of ['engine','ideal'] as const) for (const finalPh of [3.0, 3.9]) {
  let worst = 0; let w: any = null; let fails = 0;
  const t0 = performance.now();
  for (const g of GRID) {
    const input = gridTitration(g, model, finalPh, 0, 1);
    try { const r = reduceTitration({...input, method:'modified_gran'}, makerFor(model));
      const rel = r.alkalinity_meq_l/g.alkalinityMeqL-1; if (Math.abs(rel)>Math.abs(worst)) {worst=rel; w={...g, dic: r.dic_umol_kg, conf: r.confidence.level}}
    } catch(e) { fails++; console.log(g, String(e)); }
  }
  console.log(model, finalPh, (worst*100).toFixed(4), JSON.stringify(w), fails, (performance.now()-t0).toFixed(0),'ms');
}
