import { defineConfig } from 'vitest/config';
import { aliases } from './vite.config.ts';

export default defineConfig({
  resolve: { alias: aliases },
  test: {
    setupFiles: ['tests/helpers/setup.ts'],
    projects: [
      { extends: true, test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node' } },
      { extends: true, test: { name: 'reference', include: ['tests/reference/**/*.test.ts'], environment: 'node', testTimeout: 120_000 } },
      { extends: true, test: { name: 'api', include: ['tests/api/**/*.test.ts'], environment: 'node', testTimeout: 30_000 } },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          testTimeout: 120_000,
          hookTimeout: 120_000,
          fileParallelism: false,
          // A page waits for the server (and a 300 ms search pause); the default 1 s poll is too short on a busy machine.
          expect: { poll: { timeout: 10_000 } },
        },
      },
    ],
  },
});
