import { fileURLToPath } from 'node:url'

export default defineNuxtConfig({
  modules: [['@nuxt/eslint', { config: { stylistic: true } }], '@nuxtjs/tailwindcss', '@pinia/nuxt', '@sidebase/nuxt-auth'],
  devtools: { enabled: false },
  app: {
    head: {
      title: 'Pomewright',
      htmlAttrs: { lang: 'en-GB' },
      meta: [{ name: 'description', content: 'Tree and fruit contracts, juice tests, blends and settlement for cider and perry makers and their growers.' }],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  css: [
    '@fontsource/crimson-pro/400.css',
    '@fontsource/crimson-pro/600.css',
    '@fontsource/crimson-pro/400-italic.css',
    '~/assets/css/main.css',
  ],
  runtimeConfig: {
    // NUXT_AUTH_SECRET signs the session JWT; every app instance must share it.
    authSecret: '',
  },
  // Separate build folders let several checkouts' test runs build side by side (see README).
  buildDir: process.env.POMEWRIGHT_BUILD_DIR || '.nuxt',
  compatibilityDate: '2025-07-15',
  nitro: {
    output: { dir: process.env.POMEWRIGHT_OUTPUT_DIR || '.output' },
    // Ours first (a database or storage outage answers 503), then Nuxt's own error pages.
    errorHandler: [
      fileURLToPath(new URL('./server/errors/api.ts', import.meta.url)),
      fileURLToPath(new URL('./node_modules/@nuxt/nitro-server/dist/runtime/handlers/error.mjs', import.meta.url)),
    ],
    // next-auth 4.24 no longer lists `next-auth/core` in its exports, but the auth module imports it:
    // point it at a shim that loads the file by path, and trace the whole package into the build.
    alias: { 'next-auth/core': fileURLToPath(new URL('./server/shims/next-auth-core.ts', import.meta.url)) },
    externals: { traceInclude: [fileURLToPath(new URL('./node_modules/next-auth/core/index.js', import.meta.url))] },
  },
  typescript: { strict: true },
  telemetry: false,
  auth: {
    isEnabled: true,
    baseURL: '/api/auth',
    originEnvKey: 'AUTH_ORIGIN',
    provider: { type: 'authjs', defaultProvider: 'credentials', addDefaultCallbackUrl: true },
    globalAppMiddleware: { isEnabled: true },
    sessionRefresh: { enableOnWindowFocus: false, enablePeriodically: false },
  },
})
