import type { Plugin } from 'vite'
import vue from '@vitejs/plugin-vue'
import { defineConfig } from 'vite'
import { VitePWA } from 'vite-plugin-pwa'
import { configDefaults } from 'vitest/config'
import pkg from './package.json' with { type: 'json' }
import { chunkFileName, ionicComponentsApart } from './scripts/lib/ionic-apart.ts'
import { precompress } from './scripts/lib/precompress.ts'
import { preloadFirstScreen } from './scripts/lib/preload-first-screen.ts'

const apiTarget = `http://127.0.0.1:${process.env.PORT ?? '8080'}`

/**
 * Ionic's component modules carry no side effects, but @ionic/core's root package.json does not say
 * so, and Vite only reads the root: without this, almost every Ionic component lands in the entry
 * chunk (258 KB gzip instead of about 80 for a bare app). The e2e overlay test guards this.
 */
function ionicSideEffectFree(): Plugin {
  const pattern = /[\\/]node_modules[\\/](?:@ionic[\\/]core[\\/]components|ionicons[\\/]components)[\\/]/
  return {
    name: 'lixivia:ionic-side-effect-free',
    enforce: 'post',
    transform(code, id) {
      if (pattern.test(id))
        return { code, map: null, moduleSideEffects: false }
      return null
    },
  }
}

export default defineConfig({
  plugins: [
    vue({
      template: {
        compilerOptions: {
          // Ionic elements written in kebab case are used natively (see FormInput.vue); the
          // PascalCase ones are @ionic/vue's components and resolve as usual.
          isCustomElement: tag => tag.startsWith('ion-'),
        },
      },
    }),
    ionicSideEffectFree(),
    ionicComponentsApart(),
    VitePWA({
      registerType: 'prompt',
      injectRegister: false,
      includeAssets: ['favicon.svg', 'apple-touch-icon.png', 'robots.txt'],
      manifest: {
        id: '/',
        name: 'Lixivia — brew strength and extraction',
        short_name: 'Lixivia',
        description: 'Measure strength (%TDS) and extraction yield of brewed coffee, offline, and share the record with your team.',
        lang: 'en',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        orientation: 'portrait',
        theme_color: '#23395B',
        background_color: '#FAF7F2',
        icons: [
          { src: '/icons/lixivia-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icons/lixivia-512.png', sizes: '512x512', type: 'image/png' },
          { src: '/icons/lixivia-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      workbox: {
        // Fonts and icons must be precached too, or the app opens offline without them.
        globPatterns: ['**/*.{js,css,html,woff2,svg,png,ico,webmanifest}'],
        navigateFallback: '/index.html',
        // The API and the server's phone set-up page are never answered with the app shell.
        navigateFallbackDenylist: [/^\/api\//, /^\/phone(?:\/|$)/],
        cleanupOutdatedCaches: true,
      },
    }),
    preloadFirstScreen(['src/views/SignInPage.vue', 'src/stores/session.ts']),
    precompress(),
  ],
  define: {
    __APP_VERSION__: JSON.stringify(pkg.version),
  },
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: { '/api': apiTarget },
  },
  build: {
    target: 'es2022',
    // scripts/size.ts reads which chunks the first screen needs from it.
    manifest: true,
    rolldownOptions: { output: { chunkFileNames: chunkFileName } },
    // Each lazy route lists the chunks to fetch beside it, and the lists live in the entry: the tab
    // frame and the six tabs keep theirs (they open at once), other screens keep only their CSS and
    // fetch the rest as their code asks for it, a few milliseconds later from the service worker.
    modulePreload: {
      resolveDependencies: (file, deps) => (/(?:ShellTabsPage|BenchPage|FieldPage|ZonePage|LedgerPage|GaugesPage|CrewPage|SignInPage)-/.test(file) ? deps : deps.filter(dep => dep.endsWith('.css'))),
    },
    chunkSizeWarningLimit: 600,
  },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'shared',
          environment: 'node',
          include: ['tests/shared/**/*.test.ts'],
        },
      },
      {
        extends: true,
        test: {
          name: 'server',
          environment: 'node',
          include: ['tests/server/**/*.test.ts'],
          globalSetup: ['tests/server/global-setup.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          // Phones with their own IndexedDB (fake-indexeddb) syncing with the real server.
          name: 'model',
          environment: 'node',
          include: ['tests/model/**/*.test.ts'],
          globalSetup: ['tests/server/global-setup.ts'],
          setupFiles: ['tests/client/setup.ts'],
          testTimeout: 240_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'client',
          environment: 'happy-dom',
          include: ['tests/client/**/*.test.ts'],
          setupFiles: ['tests/client/setup.ts'],
          exclude: [...configDefaults.exclude],
        },
      },
    ],
  },
})
