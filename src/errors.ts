/**
 * Error classes of heliochron: one base class and a few named kinds.
 *
 * The CLI maps every HeliochronError of kind 'invalid-input' or 'unsupported'
 * to exit code 2 with its message on one line; anything else is a defect.
 */

import { escapeControls, shortenText } from './textUnits.js';

export type ErrorKind = 'invalid-input' | 'convergence' | 'unsupported' | 'output';

/** Base class of every error heliochron raises on purpose. */
export class HeliochronError extends Error {
  readonly kind: ErrorKind;
  constructor(kind: ErrorKind, message: string) {
    super(message);
    this.name = new.target.name;
    this.kind = kind;
  }
}

/**
 * Quote a received value for a message: strings in quotes, others as JSON, long ones shortened
 * (never inside a character), control characters escaped (they never reach a terminal raw).
 */
export function quoteValue(value: unknown): string {
  let text: string;
  if (typeof value === 'string') text = JSON.stringify(value);
  else if (typeof value === 'number') text = Number.isNaN(value) ? 'NaN' : String(value);
  else if (value === undefined) text = 'nothing';
  else {
    try {
      text = JSON.stringify(value) ?? String(value);
    } catch {
      text = String(value);
    }
  }
  return shortenText(escapeControls(text), 80);
}

/**
 * The first part of a refusal: "<field>: <quoted value> is not allowed; expected <allowed>",
 * or "<field> is missing; expected <allowed>" when nothing was given.
 */
export function refusalHead(field: string, value: unknown, allowed: string): string {
  if (value === undefined) return `${field} is missing; expected ${allowed}`;
  return `${field}: ${quoteValue(value)} is not allowed; expected ${allowed}`;
}

/**
 * Bad input: names the field (an option such as `--lat`, or a path in a scene
 * file such as `walls[1].azimuthDeg`), quotes the value and says what is allowed.
 * @example new InvalidInputError('--lat', 95, 'a latitude from -90 to 90 degrees')
 *   // message: "--lat: 95 is not allowed; expected a latitude from -90 to 90 degrees"
 * @example new InvalidInputError('--lat', undefined, 'a latitude from -90 to 90 degrees')
 *   // message: "--lat is missing; expected a latitude from -90 to 90 degrees"
 */
export class InvalidInputError extends HeliochronError {
  readonly field: string;
  readonly value: unknown;
  readonly allowed: string;
  constructor(field: string, value: unknown, allowed: string, detail?: string) {
    super('invalid-input', `${refusalHead(field, value, allowed)}${detail ? `. ${detail}` : ''}`);
    this.field = field;
    this.value = value;
    this.allowed = allowed;
  }
}

/** An iteration that did not converge within its bound. */
export class ConvergenceError extends HeliochronError {
  readonly iterations: number;
  constructor(what: string, iterations: number) {
    super('convergence', `${what} did not converge after ${iterations} iterations`);
    this.iterations = iterations;
  }
}

/** A request outside what heliochron supports (a date range, a model). */
export class UnsupportedError extends HeliochronError {
  constructor(message: string) {
    super('unsupported', message);
  }
}

/** A refusal to write output (file exists, output equals input). */
export class OutputError extends HeliochronError {
  constructor(message: string) {
    super('output', message);
  }
}
