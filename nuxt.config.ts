// Stormledger — Nuxt 4 with the root layout (pages/, components/, server/ at the top).
import { fileURLToPath } from 'node:url'

export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  srcDir: '.',
  dir: { app: 'app' },
  modules: ['@pinia/nuxt', '@nuxtjs/tailwindcss', 'nuxt-auth-utils', '@nuxt/eslint'],
  // The linter's project rules live in eslint.config.mjs; the module generates the Nuxt-aware base.
  eslint: { config: { stylistic: false } },
  css: ['@fontsource/lato/400.css', '@fontsource/lato/700.css', '@fontsource/lato/400-italic.css', '~/assets/css/main.css'],
  devtools: { enabled: false },
  telemetry: false,
  app: {
    head: {
      title: 'Stormledger',
      htmlAttrs: { lang: 'en' },
      meta: [{ name: 'description', content: 'Lightning-ignition risk for fleets of non-conducting storage tanks' }],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  runtimeConfig: {
    databaseUrl: '',
    publicUrl: 'http://localhost:3000',
    smtp: { host: '127.0.0.1', port: 2525, secure: false, user: '', password: '', from: 'Stormledger <no-reply@stormledger.local>', captured: true },
    public: { appVersion: '' },
    // nuxt-auth-utils: sealed cookie sessions end after 7 days (the seal carries its own expiry too).
    session: { maxAge: 60 * 60 * 24 * 7 },
  },
  typescript: { strict: true },
  nitro: {
    experimental: { tasks: false },
    // Public files (the basemap GeoJSON above all) are served pre-compressed (gzip, brotli).
    compressPublicAssets: true,
    // Node ≥ 20.19 resolves these packages (pulled in by ExcelJS) through their "module-sync" export,
    // which Nitro's file tracing does not follow; ship those files explicitly.
    externals: {
      traceInclude: ['async-function', 'async-generator-function', 'generator-function']
        .map(p => `node_modules/${p}/require.mjs`),
    },
    // docs/ is bundled into the server so the methodology page renders from the one Markdown file
    // (the README's screenshots stay out of the bundle).
    serverAssets: [{ baseName: 'docs', dir: fileURLToPath(new URL('./docs', import.meta.url)), ignore: ['screenshots/**'] }],
  },
  vite: {
    optimizeDeps: { include: ['echarts/core', 'echarts/charts', 'echarts/components', 'echarts/renderers', 'vue-echarts', 'zod', 'seedrandom', 'jstat'] },
  },
})
