/** Bundling for the browser as src/desk/build.mjs does (esbuild, platform browser, no shim), in memory. */
import { builtinModules } from 'node:module';
import { fileURLToPath } from 'node:url';
import { build, type BuildResult, type OutputFile } from 'esbuild';

export const ROOT = fileURLToPath(new URL('../../', import.meta.url));

/** A Node built-in module name: `node:fs`, `fs`, `fs/promises`. */
export function isBuiltin(specifier: string): boolean {
  return specifier.startsWith('node:') || builtinModules.includes(specifier) || builtinModules.includes(specifier.split('/')[0]);
}

/**
 * Bundle entry points (paths from the repository root) for the browser; rejects when an import
 * cannot be resolved there (a Node built-in cannot).
 * @returns the output files and every import of a Node built-in found, as "file -> module"
 */
export async function bundleForBrowser(entryPoints: Record<string, string>): Promise<{ result: BuildResult & { outputFiles: OutputFile[] }; builtins: string[] }> {
  const result = await build({
    absWorkingDir: ROOT,
    entryPoints,
    outdir: 'dist/bundle-test',
    bundle: true,
    format: 'esm',
    platform: 'browser',
    target: 'es2022',
    write: false,
    metafile: true,
    logLevel: 'silent',
    define: { HELIOCHRON_VERSION: '"test"' },
  });
  const builtins = Object.entries(result.metafile.inputs).flatMap(([file, input]) => input.imports.filter((i) => isBuiltin(i.path)).map((i) => `${file} -> ${i.path}`));
  return { result, builtins };
}
