import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/**/*.test.ts'],
    environment: 'node',
    // A fresh PGlite per test file starts in about a second from a dumped template.
    hookTimeout: 60_000,
    testTimeout: 60_000,
    globalSetup: ['tests/support/global-setup.ts'],
    setupFiles: ['tests/support/matchers.ts'],
    pool: 'forks',
    maxWorkers: 2,
    // Engine threads at the test processes' own priority: two test files share the cores, and a
    // lowered engine thread would only wait behind the other file (tests/engine/engine-priority.test.ts sets it).
    env: { ENGINE_NICE: '0' },
  },
});
