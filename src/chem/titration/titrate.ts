/**
 * The engine's titration entry point: reduce a raw titration and, when the record carries
 * `uncertainty`, propagate it to the results. Bad input comes back as `{ error }`, never as NaN.
 */

import { type Issue, toIssue } from '../errors';
import { titrationUncertainty } from '../uncertainty/titrationUncertainty';
import { type ConstantsMaker, reduceTitration } from './reduceTitration';
import type { TitrationInput, TitrationResult } from './types';

export type TitrateOutcome = TitrationResult | { error: Issue };

export function titrate(input: TitrationInput, makeConstants: ConstantsMaker): TitrateOutcome {
  try {
    const result = reduceTitration(input, makeConstants);
    if (input.uncertainty !== undefined) {
      if (typeof input.uncertainty !== 'object' || input.uncertainty === null) {
        return {
          error: {
            code: 'uncertainty-invalid',
            message: 'uncertainty must be an object.',
            field: 'uncertainty',
          },
        };
      }
      result.uncertainty = titrationUncertainty(input, input.uncertainty, makeConstants);
    }
    return result;
  } catch (e) {
    return { error: toIssue(e) };
  }
}
