/** What every reduction method hands back before units and speciation are added. */

import type { Issue } from '../errors';
import type { PointSensitivity } from './pointSensitivity';
import type { FitQuality, TitrationConfidence } from './types';

export interface MethodResult {
  equivalenceVolumeMl: number;
  fit: FitQuality;
  warnings: Issue[];
  /** Curve fit only: DIC of the original sample, mol/L. */
  dicMolL?: number;
  /** Curve fit only: fitted alkalinity, eq/L (the others derive it from the equivalence volume). */
  alkalinityEqL?: number;
  /** Curve fit only: modelled pH of the untitrated sample, offset removed. */
  initialPh?: number;
  /** Curve fit only: the fitted parameters (see CurveFitParameters). */
  parameters?: readonly number[];
  /** Methods that fit the readings: how the result moves with each reading (for uncertainty). */
  sensitivity?: PointSensitivity;
  /** Methods that estimate their own standard errors. */
  confidence?: TitrationConfidence;
}
