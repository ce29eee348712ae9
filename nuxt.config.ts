// Wayside: one Nuxt app for the mechanic's phone and the office's desktop.
export default defineNuxtConfig({
  modules: [
    '@nuxt/eslint', '@pinia/nuxt', 'pinia-plugin-persistedstate/nuxt', '@nuxtjs/tailwindcss',
    '@vite-pwa/nuxt', 'nuxt-auth-utils', '@vueuse/nuxt',
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
    },
  },
  css: ['~/assets/css/main.css'],
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
    // Photo bytes: a folder for the fs driver here; server/plugins/storage.ts mounts it.
    uploadsDir: '.data/uploads',
    uploadsS3Bucket: '',
    loginMaxFailures: 5,
    loginMaxFailuresPerAddress: 20,
    loginLockMinutes: 15,
    session: {
      cookie: { sameSite: 'lax', httpOnly: true, secure: false },
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
  },
  typescript: {
    strict: true,
    tsConfig: { compilerOptions: { noUncheckedIndexedAccess: true } },
  },
  telemetry: false,
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
})
