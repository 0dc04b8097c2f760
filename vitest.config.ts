/// <reference types="vitest/config" />
import { getViteConfig } from 'astro/config';

export default getViteConfig({
  test: {
    include: ['src/**/*.test.ts', 'tests/integration/**/*.int.test.ts'],
    environment: 'node',
    setupFiles: ['tests/setup/fast-check.ts'],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    // Integration files share one database; run files one at a time so they never race.
    fileParallelism: false,
  },
});
