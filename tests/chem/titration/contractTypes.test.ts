import { describe, expectTypeOf, it } from 'vitest';
import type { OutputUncertainty, SolveOutput } from '../../../src/chem/api';
import type { Issue } from '../../../src/chem/errors';
import type { TitrateOutcome } from '../../../src/chem/titration/titrate';
import type { TitrationInput, TitrationMethod, TitrationResult } from '../../../src/chem/titration/types';

describe('titration and uncertainty contract types', () => {
  it('a titration result carries the CLI keys', () => {
    expectTypeOf<TitrationResult['alkalinity_meq_l']>().toEqualTypeOf<number>();
    expectTypeOf<TitrationResult['alkalinity_mg_l_caco3']>().toEqualTypeOf<number>();
    expectTypeOf<TitrationResult['equivalence_volume_ml']>().toEqualTypeOf<number>();
    expectTypeOf<TitrationResult['method']>().toEqualTypeOf<TitrationMethod>();
    expectTypeOf<TitrationResult['dic_umol_kg']>().toEqualTypeOf<number | undefined>();
    expectTypeOf<TitrationResult['warnings']>().toEqualTypeOf<Issue[]>();
    expectTypeOf<TitrationResult['fit']['r2']>().toEqualTypeOf<number | null>();
  });
  it('a raw titration needs sample, titrant, temperature and points', () => {
    expectTypeOf<{
      sample_volume_ml: number;
      titrant_normality: number;
      temperature_c: number;
      points: { volume_ml: number; ph: number }[];
    }>().toExtend<TitrationInput>();
    expectTypeOf<TitrateOutcome>().toEqualTypeOf<TitrationResult | { error: Issue }>();
  });
  it('uncertainty is keyed by output name, the same shape for solves and titrations', () => {
    expectTypeOf<SolveOutput['uncertainty']>().toEqualTypeOf<Record<string, OutputUncertainty> | undefined>();
    expectTypeOf<TitrationResult['uncertainty']>().toEqualTypeOf<
      Record<string, OutputUncertainty> | undefined
    >();
  });
});
