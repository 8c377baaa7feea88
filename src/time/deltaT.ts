/**
 * Delta T = TT - UT, the difference between uniform Terrestrial Time and Universal Time kept
 * by the Earth's rotation, with its published uncertainty, by a named model:
 *  - `morrison-2021` (default): the spline of Morrison, Stephenson, Hohenkerk and Zawilski,
 *    Proc. R. Soc. A 477: 20200776 (2021), Table S15 v. 2020 (src/time/deltaTMorrison2021.ts);
 *  - `espenak-meeus-2006`: the polynomials of Espenak and Meeus, NASA TP-2006-214141
 *    (src/time/deltaTEspenakMeeus2006.ts), the model heliochron used before.
 * Every answer names the model it used (`deltaTModelName`).
 * The argument is a decimal year (src/time/timeScales.ts derives it from a Julian Day).
 */
import { InvalidInputError } from '../errors.js';
import { espenakMeeusSeconds, espenakMeeusSigmaSeconds } from './deltaTEspenakMeeus2006.js';
import { morrison2021Seconds, morrison2021SigmaSeconds } from './deltaTMorrison2021.js';

/** Delta T in seconds and its one-sigma uncertainty in seconds. */
export interface DeltaTValue {
  readonly seconds: number;
  readonly sigmaSeconds: number;
}

/** The Delta T models heliochron offers. */
export type DeltaTModel = 'morrison-2021' | 'espenak-meeus-2006';

/** The model used unless a scene (`deltaT:`) or a command (`--delta-t`) names another. */
export const DEFAULT_DELTA_T_MODEL: DeltaTModel = 'morrison-2021';

export const DELTA_T_MODELS: readonly DeltaTModel[] = ['morrison-2021', 'espenak-meeus-2006'];

const MODEL_NAMES: Readonly<Record<DeltaTModel, string>> = {
  'morrison-2021': 'Morrison, Stephenson, Hohenkerk and Zawilski 2021 spline',
  'espenak-meeus-2006': 'Espenak and Meeus 2006 polynomials',
};

/** The plain name of a model for answers, e.g. "Morrison, Stephenson, Hohenkerk and Zawilski 2021 spline". */
export function deltaTModelName(model: DeltaTModel = DEFAULT_DELTA_T_MODEL): string {
  return MODEL_NAMES[model];
}

/**
 * Delta T in seconds for a decimal year by the named model.
 * @example deltaTSeconds(1900) // -1.977 (Morrison et al. 2021); deltaTSeconds(1900, 'espenak-meeus-2006') // -2.79
 */
export function deltaTSeconds(decimalYear: number, model: DeltaTModel = DEFAULT_DELTA_T_MODEL): number {
  return model === 'espenak-meeus-2006' ? espenakMeeusSeconds(decimalYear) : morrison2021Seconds(decimalYear);
}

/** One-sigma uncertainty of Delta T in seconds, as published with the named model. */
export function deltaTSigmaSeconds(decimalYear: number, model: DeltaTModel = DEFAULT_DELTA_T_MODEL): number {
  return model === 'espenak-meeus-2006' ? espenakMeeusSigmaSeconds(decimalYear) : morrison2021SigmaSeconds(decimalYear);
}

/**
 * Delta T (TT - UT) for a decimal year with its sigma, by the named model.
 * @example deltaT(1700.0, 'espenak-meeus-2006') // { seconds: 8.83, sigmaSeconds: 5 }
 */
export function deltaT(decimalYear: number, model: DeltaTModel = DEFAULT_DELTA_T_MODEL): DeltaTValue {
  return { seconds: deltaTSeconds(decimalYear, model), sigmaSeconds: deltaTSigmaSeconds(decimalYear, model) };
}

/**
 * Read a model name as a user writes it (scene field `deltaT`, option `--delta-t`).
 * @throws InvalidInputError naming the field, quoting the value and listing the models.
 * @example parseDeltaTModel('Espenak-Meeus-2006', '--delta-t') // 'espenak-meeus-2006'
 */
export function parseDeltaTModel(text: string, field: string): DeltaTModel {
  const t = text.trim().toLowerCase();
  const found = DELTA_T_MODELS.find((m) => m === t);
  if (found === undefined) {
    throw new InvalidInputError(field, text, `${DELTA_T_MODELS.join(' or ')} (default ${DEFAULT_DELTA_T_MODEL})`);
  }
  return found;
}
