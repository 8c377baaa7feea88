/**
 * The `--delta-t` option shared by every command that computes the sun: light, loaded with the program.
 */
import { DEFAULT_DELTA_T_MODEL, DELTA_T_MODELS, parseDeltaTModel, type DeltaTModel } from '../time/deltaT.js';

/** Flags and help text of the option. */
export const DELTA_T_FLAGS = '--delta-t <model>';
export const DELTA_T_HELP =
  `Delta T model: ${DELTA_T_MODELS.join(' or ')} (default: the scene file's deltaT:, else ${DEFAULT_DELTA_T_MODEL}, ` +
  'the 2021 spline of Morrison, Stephenson, Hohenkerk and Zawilski)';

/**
 * The option's value as a model, or undefined when it was not given.
 * @example parseDeltaTOption('espenak-meeus-2006') // 'espenak-meeus-2006'
 */
export function parseDeltaTOption(value: unknown): DeltaTModel | undefined {
  return value === undefined ? undefined : parseDeltaTModel(String(value), '--delta-t');
}
