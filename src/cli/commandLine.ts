/**
 * The command-line parser as a historian meets it: commander's Command, with three changes.
 * - A date with a negative (astronomical) year, `-44-03-15`, is a date, not an unknown option,
 *   wherever it stands (the date argument of `calendar`, `--between -100-01-01 -90-01-01`).
 * - Too many arguments (`date my scene.yaml`) is refused with the hint to put a name with
 *   spaces in quotes, the quoted form written out.
 * - A missing argument after a list option (`check --between A B scene.yaml`, where the list took
 *   the scene) is refused with the hint on the order of the arguments.
 * Every refusal is one line: "<argument>: <value> is not allowed; expected <what>. <hint>".
 */
import { EventEmitter } from 'node:events';
import { Command } from 'commander';
import { refusalHead } from '../errors.js';

/** A date whose year is negative: -44-03-15, -0043-03-15 (astronomical numbering, 0 = 1 BC). */
const NEGATIVE_YEAR_DATE = /^-\d{1,6}-\d{1,2}-\d{1,2}$/;
/** Marks a negative-year date while commander decides what is an option (a character no shell argument starts with). */
const HIDDEN = '\u0000';

const hide = (arg: string): string => (NEGATIVE_YEAR_DATE.test(arg) ? HIDDEN + arg : arg);
const unhide = (arg: unknown): unknown => (typeof arg === 'string' && arg.startsWith(HIDDEN) ? arg.slice(HIDDEN.length) : arg);

/** Quote an argument for a shell command line shown in a hint. */
function shellQuote(arg: string): string {
  return /^[\w@%+=:,./-]+$/.test(arg) ? arg : `"${arg.replace(/(["\\$`])/g, '\\$1')}"`;
}

export class HistorianCommand extends Command {
  override createCommand(name?: string): HistorianCommand {
    return new HistorianCommand(name);
  }

  /** Options are found as commander finds them, with negative-year dates kept out of their way. */
  override parseOptions(argv: string[]): { operands: string[]; unknown: string[] } {
    const { operands, unknown } = super.parseOptions(argv.map(hide));
    return { operands: operands.map((a) => unhide(a) as string), unknown: unknown.map((a) => unhide(a) as string) };
  }

  /** Option values reach their listeners as the user wrote them (commander's Command is an EventEmitter). */
  emit(event: string | symbol, ...args: unknown[]): boolean {
    return (EventEmitter.prototype.emit as (this: unknown, e: string | symbol, ...a: unknown[]) => boolean).call(this, event, ...args.map(unhide));
  }

  /** The words of an argument in its help ("the scene file (.yaml, .yml or .json)"), else its name. */
  private argumentWords(index: number): string {
    const argument = this.registeredArguments[index];
    return argument === undefined ? 'no argument' : (argument.description || argument.name()).replace(/\.$/, '');
  }

  /** Called by commander when more arguments were given than the command takes. */
  _excessArguments(received: string[]): void {
    const expected = this.registeredArguments.length;
    const field = expected === 0 ? this.name() : `<${this.registeredArguments[expected - 1].name()}>`;
    const joined = received.slice(expected - 1).join(' ');
    const before = received.slice(0, Math.max(0, expected - 1)).map(shellQuote);
    const hint =
      expected === 0
        ? `${this.name()} takes options only; see heliochron ${this.name()} --help`
        : `A name or date with spaces goes in quotes: heliochron ${this.name()} ${[...before, `"${joined}"`].join(' ')}`;
    const allowed = expected === 0 ? 'no argument' : `one argument: ${this.argumentWords(expected - 1)}`;
    this.error(`${refusalHead(field, received, allowed)}. ${hint}`, { code: 'commander.excessArguments', exitCode: 2 });
  }

  /** Called by commander when a required argument is missing. */
  missingArgument(name: string): void {
    const index = this.registeredArguments.findIndex((a) => a.name() === name);
    const allowed = this.argumentWords(index);
    // A list option (--between) takes every value up to the next option: the argument may be among them.
    const list = this.options.find((o) => o.variadic && Array.isArray(this.getOptionValue(o.attributeName())));
    const values = list === undefined ? [] : (this.getOptionValue(list.attributeName()) as string[]);
    const hint =
      list !== undefined && values.length > 0
        ? ` ${list.long} took every value after it (${values.map((v) => JSON.stringify(v)).join(', ')}); put <${name}> before ${list.long}: ` +
          `heliochron ${this.name()} ${shellQuote(values[values.length - 1])} ${list.long} ${values.slice(0, -1).map(shellQuote).join(' ')}`.trimEnd()
        : '';
    this.error(`${refusalHead(`<${name}>`, undefined, allowed)}.${hint}`, { code: 'commander.missingArgument', exitCode: 2 });
  }
}
