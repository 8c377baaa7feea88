/**
 * The `--seed` option shared by the commands that may run a Monte Carlo (pixel measurements whose
 * first-order sigma is not reliable): light, loaded with the program.
 */
import { InvalidInputError } from '../errors.js';

/** Flags and help text of the option. */
export const SEED_FLAGS = '--seed <n>';
export const SEED_HELP = "seed of every Monte Carlo run, printed with the answer (default: the scene file's seed:, else 1)";

/** Largest seed: the generator (src/math/random.ts) takes a 32-bit unsigned integer. */
const MAX_SEED = 4294967295;

/**
 * The option's value as a seed, or undefined when it was not given.
 * @example parseSeedOption('42') // 42
 */
export function parseSeedOption(value: unknown): number | undefined {
  if (value === undefined) return undefined;
  const text = String(value).trim();
  const seed = /^\d+$/.test(text) ? Number(text) : NaN;
  if (!Number.isSafeInteger(seed) || seed > MAX_SEED) {
    throw new InvalidInputError('--seed', text, `a whole number from 0 to ${MAX_SEED}`);
  }
  return seed;
}
