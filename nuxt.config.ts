import { fileURLToPath } from 'node:url'

// Wayside: one Nuxt app for the mechanic's phone and the office's desktop.
export default defineNuxtConfig({
  modules: [
    '@nuxt/eslint', '@pinia/nuxt', 'pinia-plugin-persistedstate/nuxt', '@nuxtjs/tailwindcss', '@vite-pwa/nuxt', 'nuxt-auth-utils',
    '@vueuse/nuxt', 'nuxt-security',
  ],
  devtools: { enabled: false },
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Wayside',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1, viewport-fit=cover' },
        { name: 'description', content: 'Road-call service records for heavy-duty mechanics, dispatch and billing' },
        { name: 'theme-color', content: '#0b1d2a' },
      ],
      link: [{ rel: 'icon', href: '/favicon.svg', type: 'image/svg+xml' }],
      // Before any module: zod would probe for eval (new Function) when it builds its schemas, and
      // the content security policy reports that probe as a violation; without it zod parses
      // without compiling (globalThis.__zod_globalConfig is the config zod's core reads first).
      script: [{ innerHTML: 'globalThis.__zod_globalConfig={jitless:true}', tagPriority: 'critical' }],
    },
  },
  css: ['~/assets/css/main.css'],
  // Painted by the offline shell (and any page rendered in the browser) before the app's scripts
  // run: the phone shows its bar and a line at once, not a blank screen (app/spa-loading-template.html).
  spaLoadingTemplate: 'spa-loading-template.html',
  runtimeConfig: {
    // Every value can be set by NUXT_<NAME> at run time (see README, Configuration).
    databaseUrl: 'postgres://wayside@127.0.0.1:54329/wayside',
    smtpHost: '127.0.0.1',
    smtpPort: 2525,
    smtpUser: '',
    smtpPass: '',
    mailFrom: 'Wayside <calls@wayside.test>',
    // The domain of the Message-ID each queued message keeps across retries.
    mailIdDomain: 'wayside.test',
    // Seconds, not minutes: a slow mail server fails an attempt, never a person's request.
    smtpConnectionTimeoutMs: 10_000,
    smtpGreetingTimeoutMs: 10_000,
    smtpSocketTimeoutMs: 30_000,
    // Mail jobs retry with doubling waits from this delay; after the last one the message shows as failed.
    mailRetryLimit: 8,
    mailRetryDelaySeconds: 5,
    // Whether this process works the job queue (NUXT_JOBS_WORK=false for a web-only server).
    jobsWork: true,
    jobsPollSeconds: 1,
    stripeSecretKey: 'sk_test_wayside_local',
    stripeWebhookSecret: 'whsec_wayside_local',
    stripeApiHost: '127.0.0.1',
    stripeApiPort: 12111,
    stripeApiProtocol: 'http',
    // What invoices are in; a card payment in another currency is held, not counted.
    paymentCurrency: 'usd',
    // Where payers and fleets reach this server (links in e-mail, QR codes): NUXT_SITE_URL.
    siteUrl: 'http://127.0.0.1:3000',
    photoMaxBytes: 10 * 1024 * 1024,
    // A mechanic's first pull: open calls and those of the last this many days (plus each unit's last few).
    syncRecentDays: 30,
    // Photo bytes (server/plugins/storage.ts): this folder, unless a bucket is named; then an
    // S3-compatible object store at uploadsS3Endpoint, which every app server shares.
    uploadsDir: '.data/uploads',
    uploadsS3Bucket: '',
    uploadsS3Endpoint: '',
    uploadsS3Region: 'us-east-1',
    uploadsS3AccessKeyId: '',
    uploadsS3SecretAccessKey: '',
    // Sign-in limiter (server/utils/loginLimiter.ts): failures per account at one address, then
    // a pause of loginLockMinutes; a much higher bound per address over the same window.
    loginMaxFailures: 5,
    loginMaxFailuresPerAddress: 100,
    loginLockMinutes: 15,
    // Behind a load balancer: take the client's address from X-Forwarded-For (NUXT_TRUST_PROXY=true).
    trustProxy: false,
    session: {
      // Secure unless the local scripts (plain http on 127.0.0.1) set NUXT_SESSION_COOKIE_SECURE=false.
      cookie: { sameSite: 'lax', httpOnly: true, secure: true },
      maxAge: 60 * 60 * 24 * 14,
    },
    public: {
      appName: 'Wayside',
    },
  },
  routeRules: {
    // The offline shell: rendered ahead of time, client-only, precached by the service worker.
    '/shell': { ssr: false, prerender: true },
  },
  experimental: {
    // With payload extraction on, the offline shell asks for an uncached _payload.json.
    payloadExtraction: false,
  },
  compatibilityDate: '2026-11-01',
  nitro: {
    prerender: { routes: ['/shell'] },
    // Static files are compressed once at build and served as the client accepts (brotli, gzip);
    // answers made per request are compressed by server/plugins/compression.ts.
    compressPublicAssets: { gzip: true, brotli: true },
  },
  typescript: {
    strict: true,
    tsConfig: { compilerOptions: { noUncheckedIndexedAccess: true } },
  },
  telemetry: false,
  hooks: {
    // Our error handler first (503 for a database that does not answer, request ids in JSON
    // errors), then Nuxt's, which renders app/error.vue for pages.
    'nitro:config'(config) {
      const nuxtHandlers = [config.errorHandler].flat().filter((h): h is string => typeof h === 'string')
      config.errorHandler = [fileURLToPath(new URL('./server/error.ts', import.meta.url)), ...nuxtHandlers]
    },
  },
  // Lint with Nuxt's own config and its stylistic rules (npm run lint; part of npm test).
  eslint: { config: { stylistic: true } },
  pwa: {
    registerType: 'prompt',
    injectRegister: false,
    manifest: {
      name: 'Wayside',
      short_name: 'Wayside',
      description: 'Road-call service records for heavy-duty mechanics',
      theme_color: '#0b1d2a',
      background_color: '#f7f4ea',
      display: 'standalone',
      start_url: '/',
      icons: [
        { src: '/icons/wayside-192.png', sizes: '192x192', type: 'image/png' },
        { src: '/icons/wayside-512.png', sizes: '512x512', type: 'image/png' },
        { src: '/icons/wayside-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
      ],
    },
    workbox: {
      globPatterns: ['**/*.{js,css,html,woff,woff2,svg,png,webmanifest}'],
      navigateFallback: null,
      // The first worker takes charge of open pages at once; later ones wait for the prompt.
      clientsClaim: true,
      cleanupOutdatedCaches: true,
      runtimeCaching: [
        {
          urlPattern: ({ request, url }) => request.mode === 'navigate' && !url.pathname.startsWith('/api/'),
          handler: 'NetworkOnly',
          options: { precacheFallback: { fallbackURL: '/shell' } },
        },
      ],
    },
    client: { installPrompt: false, periodicSyncForUpdates: 3600 },
    devOptions: { enabled: false },
  },
  // Security headers and the content security policy (nuxt-security 2.5: the line that runs on
  // Node 20). Its rate limiter is off (in one process's memory; the sign-in limiter lives in
  // PostgreSQL), its size limiter too (server/middleware/bodyLimit.ts caps bodies by route), and
  // its XSS filter and CORS handler (Vue escapes output; the API is same-origin only).
  security: {
    rateLimiter: false,
    requestSizeLimiter: false,
    xssValidator: false,
    corsHandler: false,
    allowedMethodsRestricter: false,
    // Keep console output: the phone's sync reports through it and the browser tests read it.
    removeLoggers: false,
    nonce: true,
    headers: {
      contentSecurityPolicy: {
        'default-src': ['\'self\''],
        'base-uri': ['\'none\''],
        'object-src': ['\'none\''],
        'frame-ancestors': ['\'self\''],
        'form-action': ['\'self\''],
        // Nuxt's entry and inline payload carry the per-request nonce (prerendered pages such as
        // the offline shell get hashes instead); 'strict-dynamic' lets those load the route chunks.
        'script-src': ['\'self\'', '\'strict-dynamic\'', '\'nonce-{{nonce}}\''],
        'script-src-attr': ['\'none\''],
        'style-src': ['\'self\'', '\'unsafe-inline\''],
        // Photos waiting on the phone are shown from blob: URLs; the signature is a data: PNG.
        'img-src': ['\'self\'', 'data:', 'blob:'],
        'font-src': ['\'self\'', 'data:'],
        'connect-src': ['\'self\''],
        'worker-src': ['\'self\''],
        'manifest-src': ['\'self\''],
        // HTTPS is the load balancer's job; upgrading here would break plain http on 127.0.0.1.
        'upgrade-insecure-requests': false,
      },
      referrerPolicy: 'same-origin',
      // The phone asks for its position (with consent) and may use the camera for photos.
      permissionsPolicy: { 'camera': ['self'], 'geolocation': ['self'], 'microphone': [], 'display-capture': [], 'fullscreen': ['self'] },
    },
  },
})
