import { defineConfig } from 'vitest/config'

// Browser end-to-end tests: the real `npm start` stack and Debian's Chromium, one file at a time.
export default defineConfig({
  test: {
    name: 'e2e',
    environment: 'node',
    include: ['tests/e2e/**/*.spec.ts'],
    globalSetup: ['tests/e2e/global-setup.ts'],
    fileParallelism: false,
    testTimeout: 90_000,
    hookTimeout: 240_000,
  },
})
