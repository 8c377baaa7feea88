/**
 * The form of an output file, from its name: `-o answer.json` writes JSON, `-o answer.csv` CSV,
 * `-o answer.txt` text; a name without an extension takes the form the flags ask for. A name whose
 * extension says another form than the flags (`--json -o answer.csv`), or a form the command does
 * not write (`date -o report.html`), is refused before any work, so that no file ever holds text
 * its name belies. Light, loaded with the program.
 */
import { extname } from 'node:path';
import { InvalidInputError } from '../errors.js';

export type OutputForm = 'text' | 'json' | 'csv' | 'svg' | 'html';

const EXTENSIONS: Record<string, OutputForm> = {
  '.txt': 'text',
  '.text': 'text',
  '.json': 'json',
  '.csv': 'csv',
  '.svg': 'svg',
  '.html': 'html',
  '.htm': 'html',
};

const FORM_WORDS: Record<OutputForm, string> = { text: 'text', json: 'JSON', csv: 'CSV', svg: 'SVG', html: 'HTML' };
const FORM_EXTENSION: Record<OutputForm, string> = { text: '.txt', json: '.json', csv: '.csv', svg: '.svg', html: '.html' };
/** Which command writes a form this one does not. */
const OTHER_COMMAND: Partial<Record<OutputForm, string>> = { html: 'heliochron report', svg: 'heliochron chart' };

/** "text, JSON or CSV". */
function wordList(words: readonly string[]): string {
  return words.length <= 1 ? words.join('') : `${words.slice(0, -1).join(', ')} or ${words[words.length - 1]}`;
}

/**
 * The form to write, checked against the output file's name.
 * @param output the -o file name, or undefined (printing)
 * @param asked the form the flags ask for (--json, --csv, else the command's own form)
 * @param flagGiven true when a flag (--json, --csv) asked for the form
 * @param forms the forms this command writes, its default first
 * @param command the command's name, for the message
 * @example outputForm('answer.json', 'text', false, ['text', 'json', 'csv'], 'date') // 'json'
 * @throws InvalidInputError naming --output, quoting the name and listing the extensions allowed
 */
export function outputForm(output: string | undefined, asked: OutputForm, flagGiven: boolean, forms: readonly OutputForm[], command: string): OutputForm {
  if (output === undefined) return asked;
  const ext = extname(output).toLowerCase();
  if (ext === '') return asked;
  const allowed = `a file name ending in ${forms.map((f) => `${FORM_EXTENSION[f]} (${FORM_WORDS[f]})`).join(', ')}, or without an extension`;
  const named = EXTENSIONS[ext];
  if (named === undefined || !forms.includes(named)) {
    const other = named === undefined ? undefined : OTHER_COMMAND[named];
    const hint = `${command} writes ${wordList(forms.map((f) => FORM_WORDS[f]))}, not ${named === undefined ? `a ${ext} file` : FORM_WORDS[named]}`;
    const pdf = ext === '.pdf' && forms.includes('html') ? '; open the HTML in a browser and print it to PDF' : '';
    throw new InvalidInputError('--output', output, allowed, other === undefined ? `${hint}${pdf}.` : `${hint}; for ${FORM_WORDS[named as OutputForm]} use ${other}.`);
  }
  if (flagGiven && named !== asked) {
    throw new InvalidInputError('--output', output, allowed, `The name says ${FORM_WORDS[named]} but --${asked} asks for ${FORM_WORDS[asked]}; change one of them.`);
  }
  return named;
}
