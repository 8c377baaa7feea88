/**
 * Vitest's global set-up: bundle the command line (src/cli/build.mjs, into dist/bin) from the
 * current sources before any test runs, so that the tests that start the program as a user does
 * (the package's `bin`, tests/helpers/runCli.ts `BIN`) never run a stale bundle. Without the code
 * caches (they take seconds to make; the program runs the same without them, and
 * tests/cli/bundle.test.ts builds and checks one); `npm run build` makes them again.
 */
// @ts-expect-error: a plain ES module script without type declarations
import { buildCli } from '../../src/cli/build.mjs';

export default async function setup(): Promise<void> {
  await (buildCli as (o: object) => Promise<unknown>)({ codeCache: false });
}
