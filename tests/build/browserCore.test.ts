/**
 * The core (everything under src/ but the front ends src/cli and src/desk, and src/node.ts) runs
 * unchanged in a browser: no Node built-in is imported, and no Node global (Buffer, process,
 * require, __dirname, __filename) or import.meta (the way file paths creep in) is used. The files are
 * read with the TypeScript parser, so that words in comments and strings do not count. The core's
 * entry, src/index.ts, must bundle for the browser (esbuild, platform browser) with no built-in.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { build } from 'esbuild';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';
import { bundleForBrowser, isBuiltin, ROOT } from '../helpers/browserBundle.js';

const SRC = join(ROOT, 'src');
/** The front ends, where file access belongs. */
const FRONT_ENDS = [join(SRC, 'cli'), join(SRC, 'desk'), join(SRC, 'node.ts')];
const NODE_GLOBALS = new Set(['Buffer', 'process', 'require', '__dirname', '__filename']);

function coreFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (FRONT_ENDS.includes(path)) return [];
    if (entry.isDirectory()) return coreFiles(path);
    return entry.name.endsWith('.ts') ? [path] : [];
  });
}

/** What in a module's text would not run in a browser: built-in imports, Node globals, import.meta. */
function nodeUses(text: string, fileName = 'module.ts'): string[] {
  const source = ts.createSourceFile(fileName, text, ts.ScriptTarget.ES2022, true);
  const found: string[] = [];
  const visit = (node: ts.Node): void => {
    if ((ts.isImportDeclaration(node) || ts.isExportDeclaration(node)) && node.moduleSpecifier && ts.isStringLiteral(node.moduleSpecifier)) {
      if (isBuiltin(node.moduleSpecifier.text)) found.push(`imports ${node.moduleSpecifier.text}`);
    } else if (ts.isCallExpression(node) && node.expression.kind === ts.SyntaxKind.ImportKeyword) {
      const [first] = node.arguments;
      if (first !== undefined && ts.isStringLiteral(first) && isBuiltin(first.text)) found.push(`imports ${first.text}`);
    } else if (ts.isMetaProperty(node) && node.keywordToken === ts.SyntaxKind.ImportKeyword) {
      found.push('uses import.meta');
    } else if (ts.isIdentifier(node) && NODE_GLOBALS.has(node.text)) {
      const parent = node.parent;
      // A property name (globalThis.process?.versions, { process: ... }) is not the Node global.
      const isPropertyName =
        (ts.isPropertyAccessExpression(parent) && parent.name === node) ||
        (ts.isPropertyAssignment(parent) && parent.name === node) ||
        (ts.isPropertySignature(parent) && parent.name === node) ||
        (ts.isPropertyDeclaration(parent) && parent.name === node) ||
        (ts.isMethodDeclaration(parent) && parent.name === node);
      if (!isPropertyName) found.push(`uses ${node.text}`);
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return found;
}

describe('the core runs in a browser', () => {
  it('finds what it looks for (the check itself can fail)', () => {
    expect(nodeUses("import { readFileSync } from 'node:fs';")).toEqual(['imports node:fs']);
    expect(nodeUses("import { join } from 'path';")).toEqual(['imports path']);
    expect(nodeUses("const b: Buffer = Buffer.from('x');")).toEqual(['uses Buffer', 'uses Buffer']);
    expect(nodeUses('const cwd = process.cwd();')).toEqual(['uses process']);
    expect(nodeUses("const fs = await import('node:fs');")).toEqual(['imports node:fs']);
    expect(nodeUses("const url = new URL('../../data/x.json', import.meta.url);")).toEqual(['uses import.meta']);
    // Words in comments and strings, and property names, are not uses.
    expect(nodeUses("// the same text as Node's Buffer\nconst s = 'process.cwd()';\nconst v = (globalThis as { process?: { version?: string } }).process?.version;")).toEqual([]);
  });

  it('no file of the core imports a Node built-in or uses a Node global', () => {
    const files = coreFiles(SRC);
    // The core's folders are all there (a wrong path would make this check empty).
    for (const folder of ['calendar', 'time', 'ephemeris', 'geometry', 'image', 'scene', 'solver', 'uncertainty', 'report', 'charts']) {
      expect(files.some((f) => relative(SRC, f).startsWith(`${folder}/`)), folder).toBe(true);
    }
    const offences = files.flatMap((f) => nodeUses(readFileSync(f, 'utf8'), f).map((use) => `${relative(ROOT, f)} ${use}`));
    expect(offences).toEqual([]);
  });

  it('the core entry src/index.ts bundles for the browser with no Node built-in', async () => {
    const { result, builtins } = await bundleForBrowser({ index: 'src/index.ts' });
    expect(result.errors).toEqual([]);
    expect(builtins).toEqual([]);
    expect(result.outputFiles[0].text).toContain('calendarDateToJd');
  });

  it('a module importing a Node built-in does not bundle for the browser (so the check above can fail)', async () => {
    const attempt = build({
      absWorkingDir: ROOT,
      stdin: { contents: "import { readFileSync } from 'node:fs'; console.log(readFileSync);", loader: 'ts', resolveDir: SRC },
      bundle: true,
      format: 'esm',
      platform: 'browser',
      write: false,
      logLevel: 'silent',
    });
    await expect(attempt).rejects.toThrow(/node:fs/);
  });
});
