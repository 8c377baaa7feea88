/**
 * The `heliochron report` command as the user would type it again, for the report's
 * reproducibility block (written by the command and by the desk's page; no file access here).
 */
import type { ReportOptions } from './reportSpec.js';

/** A command-line word, quoted when it holds anything but plain path characters. */
export function shellWord(word: string): string {
  return /^[A-Za-z0-9_./:=+-]+$/.test(word) ? word : `'${word.replace(/'/g, `'\\''`)}'`;
}

/** The command as the user would type it again (paths as given). */
export function reportCommandLine(scenePath: string, options: ReportOptions): string {
  const words = ['heliochron', 'report', scenePath];
  if (options.output !== undefined) words.push('-o', options.output);
  if (options.force) words.push('--force');
  // The year as resolved (a bare --same-light-in means this year), so that the command gives the same report again.
  if (options.sameLightIn !== undefined && options.zone !== undefined) words.push('--same-light-in', String(options.sameLightIn), '--zone', options.zone);
  return words.map(shellWord).join(' ');
}
