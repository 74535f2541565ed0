import antfu from '@antfu/eslint-config'

export default antfu(
  {
    vue: true,
    typescript: true,
    ignores: ['dist/**', '.data/**', 'dev-dist/**', 'server/db/migrations/**', 'tests/e2e/screenshots/**', '**/*.md'],
  },
  {
    rules: {
      // Ionic's components are web components: `slot="end"` is the native Shadow DOM slot, not
      // Vue 2's slot syntax. The rule's autofix turns it into a Vue slot and the element vanishes.
      'vue/no-deprecated-slot-attribute': 'off',
      // A describe names its unit as the code does: SignInPage, GET /api/v1/health, fitCalibration.
      'test/prefer-lowercase-title': ['error', { ignore: ['describe'] }],
    },
  },
  {
    // The calculations and schemas run on the phone and on the server alike: no DOM, no Node,
    // no framework or storage library may leak into them.
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [
          { group: ['vue', 'vue-router', 'pinia', '@ionic/*', 'dexie', 'express', 'drizzle-orm', 'drizzle-orm/*', 'mysql2', 'mysql2/*'], message: 'shared/ is pure TypeScript: no framework, storage or server imports.' },
          { group: ['node:*', 'fs', 'path', 'os', 'crypto', 'http'], message: 'shared/ runs in the browser too: no Node modules.' },
        ],
      }],
      'no-restricted-globals': ['error', 'window', 'document', 'navigator', 'localStorage', 'indexedDB', 'fetch', 'process', 'Buffer', '__dirname', 'require'],
    },
  },
  {
    files: ['scripts/**/*.ts', 'server/**/*.ts', 'tests/**/*.ts', '*.config.ts'],
    rules: {
      // Command-line scripts and the server report to the terminal on purpose.
      'no-console': 'off',
      'node/prefer-global/process': 'off',
      'node/prefer-global/buffer': 'off',
    },
  },
  {
    files: ['tests/e2e/**/*.ts'],
    rules: {
      // `locator.innerText()` is Playwright's API (rendered text), not a DOM property.
      'unicorn/prefer-dom-node-text-content': 'off',
    },
  },
)
