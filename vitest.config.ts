import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    testTimeout: 120_000,
    hookTimeout: 120_000,
    reporters: ['default'],
    pool: 'forks',
    // The command line is bundled into dist/bin from the current sources before the tests run.
    globalSetup: ['tests/helpers/buildCli.ts'],
  },
});
