import { defineConfig } from 'vitest/config';

// Browser tests: the built product served on a free port, driven in Debian's Chromium.
export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    include: ['tests/e2e/**/*.e2e.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 120_000,
    hookTimeout: 180_000,
  },
});
