import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    exclude: ['test/bench/**', 'node_modules/**', 'dist/**'],
    testTimeout: 120_000,
    hookTimeout: 120_000,
    pool: 'forks',
    maxWorkers: 2,
    // @actions/workflow-parser imports its JSON schema without an import attribute, which Node's
    // loader refuses; vite's transform handles it when the package is inlined.
    server: { deps: { inline: ['@actions/workflow-parser'] } },
  },
});
