import { describe, expect, it } from 'vitest';
import { progressLine } from '../../src/cli/progress.js';
import type { CliIo } from '../../src/cli/io.js';

function io(errIsTerminal: boolean): { io: CliIo; err: () => string } {
  let err = '';
  return { io: { out: () => undefined, err: (t) => { err += t; }, errIsTerminal, cwd: '.' }, err: () => err };
}

describe('progress on stderr', () => {
  it('writes nothing at all when stderr is not a terminal', () => {
    const t = io(false);
    const p = progressLine(t.io, 'work');
    expect(p.onProgress).toBeUndefined();
    p.finish();
    expect(t.err()).toBe('');
  });
  it('rewrites one line in place on a terminal, once per whole percent, and clears it at the end', () => {
    const t = io(true);
    const p = progressLine(t.io, 'work');
    for (let i = 1; i <= 400; i += 1) p.onProgress!(i, 400);
    const writes = t.err().split('\r').filter((s) => s !== '');
    expect(writes.filter((s) => s.startsWith('work:')).length).toBe(101); // 0% to 100%
    expect(t.err()).toContain('\rwork: 100%');
    p.finish();
    expect(t.err().endsWith('\r')).toBe(true);
    expect(t.err()).not.toContain('\n');
  });
});
