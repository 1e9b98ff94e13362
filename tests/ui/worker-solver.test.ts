import { describe, expect, it } from 'vitest';
import type { SolveInput } from '../../src/chem/api';
import { solve } from '../../src/chem/solve';
import { answeringSolver } from '../../src/ui/data/worker-solver';

// Invented waters: a reef tank and a fresh spring.
const reef: SolveInput = {
  model: 'saline',
  salinity: 35,
  temperature_c: 25,
  ph: 8.05,
  alkalinity_umol_kg: 2300,
};
const spring: SolveInput = { model: 'fresh', temperature_c: 9, ph: 7.2, alkalinity_meq_l: 3.1 };

describe('a solver answering from results computed elsewhere (the engine worker)', () => {
  it('answers by the content of the input, whatever the key order or call order', () => {
    const inputs = [reef, spring];
    const s = answeringSolver(
      inputs,
      inputs.map((i) => solve(i)),
    );
    const reordered: SolveInput = Object.fromEntries(Object.entries(reef).reverse());
    expect(s(spring)).toEqual(solve(spring));
    expect(s(reordered)).toEqual(solve(reef));
  });
  it('says so, with a code, for an input it was not given', () => {
    const s = answeringSolver([reef], [solve(reef)]);
    expect(s({ ...reef, ph: 8.1 })).toMatchObject({ error: { code: 'internal-error' } });
  });
});
