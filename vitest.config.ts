import { defineConfig } from 'vitest/config';

// Vitest runs the Node-side suites: the engine (shared/), the API (server/) and the
// cross-cutting tests. The Angular projects are tested by `ng test` (see angular.json).
export default defineConfig({
  resolve: { tsconfigPaths: true },
  test: {
    include: [
      'shared/**/*.spec.ts',
      'server/**/*.spec.ts',
      'tests/**/*.spec.ts',
      'scripts/**/*.spec.ts',
    ],
    exclude: ['tests/e2e/**', 'node_modules/**', 'dist/**'],
    environment: 'node',
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
