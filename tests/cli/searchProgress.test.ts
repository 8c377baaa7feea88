/**
 * The progress line of the search: shown on stderr only when stderr is a terminal, cleared at the
 * end, and never part of the answer (src/cli/progress.ts, src/solver/solveDates.ts onProgress).
 */
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { main } from '../../src/cli/main.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

async function run(errIsTerminal: boolean): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await main(['date', 'examples/salt-house-sketch.yaml'], { out: (t) => { out += t; }, err: (t) => { err += t; }, errIsTerminal, cwd: ROOT });
  return { code, out, err };
}

describe('the search progress of heliochron date', () => {
  it('is shown on a terminal as one line rewritten in place and cleared, and the answer is the same', async () => {
    const quiet = await run(false);
    const shown = await run(true);
    expect(quiet.code).toBe(0);
    expect(quiet.err).toBe('');
    expect(shown.code).toBe(0);
    expect(shown.out).toBe(quiet.out);
    expect(shown.err).toContain('\rsearching the window: ');
    expect(shown.err).toMatch(/100%|\d+%/);
    expect(shown.err.endsWith('\r')).toBe(true); // cleared: blanks, then back to the line's start
    expect(shown.err).not.toContain('\n');
  });
});
