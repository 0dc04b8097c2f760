/// <reference types="vitest/config" />
import { defineConfig } from 'vitest/config';

// Browser tests: headless Chromium (playwright-core) against the built server that
// scripts/test.mjs started. One file at a time: they share the seeded demo shop.
export default defineConfig({
  test: {
    include: ['tests/e2e/**/*.spec.ts'],
    environment: 'node',
    testTimeout: 120_000,
    hookTimeout: 120_000,
    fileParallelism: false,
  },
});
