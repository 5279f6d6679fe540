import { fileURLToPath } from 'node:url'
import { LAB_SHEET_MAX_REQUEST_BYTES } from './shared/schemas/labSheet'

const MiB = 1024 * 1024

export default defineNuxtConfig({
  modules: [['@nuxt/eslint', { config: { stylistic: true } }], '@nuxtjs/tailwindcss', '@pinia/nuxt', '@sidebase/nuxt-auth', 'nuxt-security'],
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
  routeRules: {
    // Juice lab sheets: several files of up to 10 MiB each in one multipart request. The route reads
    // the parts itself and refuses a file past its limit as it arrives; this refuses the request
    // by its Content-Length at the same size (the limiter refuses at or above the number given).
    '/api/lab-sheets/**': { security: { requestSizeLimiter: { maxRequestSizeInBytes: MiB, maxUploadFileRequestInBytes: LAB_SHEET_MAX_REQUEST_BYTES + 1 } } },
    // A PDF sheet is shown in a frame beside the form its readings are typed into: this answer
    // alone may be framed, and only by our own pages.
    '/api/lab-sheets/*/pdf': {
      security: {
        requestSizeLimiter: { maxRequestSizeInBytes: MiB, maxUploadFileRequestInBytes: LAB_SHEET_MAX_REQUEST_BYTES + 1 },
        headers: { xFrameOptions: 'SAMEORIGIN' },
      },
    },
  },
  compatibilityDate: '2025-07-15',
  nitro: {
    output: { dir: process.env.POMEWRIGHT_OUTPUT_DIR || '.output' },
    // Served pre-compressed (brotli or gzip, as the browser asks); the hashed files under /_nuxt/
    // are cached for a year as immutable, which Nuxt sets for that folder.
    compressPublicAssets: { gzip: true, brotli: true },
    // Ours first (a database or storage outage answers 503), then Nuxt's own error pages.
    errorHandler: [
      fileURLToPath(new URL('./server/errors/api.ts', import.meta.url)),
      fileURLToPath(new URL('./node_modules/@nuxt/nitro-server/dist/runtime/handlers/error.mjs', import.meta.url)),
    ],
    // next-auth 4.24 no longer lists `next-auth/core` in its exports, but the auth module imports it:
    // point it at a shim that loads the file by path, and trace the whole package into the build.
    alias: { 'next-auth/core': fileURLToPath(new URL('./server/shims/next-auth-core.ts', import.meta.url)) },
    // get-intrinsic (under exceljs, which reads lab sheets) requires three packages whose exports
    // send Node 20.19+ to a "module-sync" file the tracer does not follow: trace those files too.
    externals: {
      traceInclude: [
        './node_modules/next-auth/core/index.js',
        './node_modules/async-function/require.mjs',
        './node_modules/async-generator-function/require.mjs',
        './node_modules/generator-function/require.mjs',
      ].map(path => fileURLToPath(new URL(path, import.meta.url))),
    },
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
  // Security headers and request limits; what differs from nuxt-security's defaults, and why.
  // https://nuxt-security.vercel.app/headers/csp
  security: {
    nonce: true,
    headers: {
      contentSecurityPolicy: {
        'default-src': ["'self'"],
        'base-uri': ["'none'"],
        'connect-src': ["'self'"],
        // Crimson Pro is served from /_nuxt/ with the app.
        'font-src': ["'self'"],
        'form-action': ["'self'"],
        'frame-ancestors': ["'none'"],
        'img-src': ["'self'", 'data:'],
        'object-src': ["'none'"],
        'script-src-attr': ["'none'"],
        // Every script tag the server renders (the entry, Nuxt's inline config) carries this
        // request's nonce; 'strict-dynamic' lets those load the page chunks they import.
        'script-src': ["'self'", "'strict-dynamic'", "'nonce-{{nonce}}'"],
        // Vue renders style attributes into the HTML (v-show, bound styles); a style runs no script.
        'style-src': ["'self'", "'unsafe-inline'"],
        // Everything is same-origin, so over HTTPS there is nothing to upgrade; over plain http
        // (a local instance) it would send the page's own files to an https address that is not there.
        'upgrade-insecure-requests': false,
      },
      referrerPolicy: 'same-origin',
      xFrameOptions: 'DENY',
      // Sent by server/middleware/hsts.ts on requests that came over HTTPS only.
      strictTransportSecurity: false,
    },
    // JSON and form bodies up to 1 MiB; no route takes file uploads yet (see routeRules below).
    requestSizeLimiter: { maxRequestSizeInBytes: MiB, maxUploadFileRequestInBytes: MiB },
    // Its limiter counts in each instance's memory, so several instances would each allow the
    // full rate; sign-in failures are counted in the database instead (server/middleware/signin-limit.ts).
    rateLimiter: false,
    // It refuses ordinary text that merely looks like markup (a note with "<" in it); output is
    // escaped by Vue, and bodies are checked by the routes' zod schemas.
    xssValidator: false,
  },
})
