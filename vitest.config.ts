import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    exclude: ['test/bench/**', 'node_modules/**'],
    testTimeout: 60_000,
    pool: 'forks',
    // Test files share a worker's module cache: every file imports pure modules (and several
    // import mathjs, whose load dominated the run at ~2 s per file), so isolation buys nothing.
    isolate: false,
  },
});
