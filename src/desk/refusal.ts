/** A refusal by the library, as the desk shows it: the field it names and its own message. */
import { HeliochronError, InvalidInputError } from '../errors.js';

export interface Refusal {
  /** The field the library named (`walls[0].imagePlane.pointsPx`), or '' for the file as a whole. */
  readonly field: string;
  readonly message: string;
}

export function refusalOf(error: unknown): Refusal {
  if (error instanceof InvalidInputError) return { field: error.field, message: error.message };
  if (error instanceof HeliochronError) return { field: '', message: error.message };
  return { field: '', message: error instanceof Error ? error.message : String(error) };
}
