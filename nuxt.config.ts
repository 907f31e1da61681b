// The card layout lives at the repository root. Pin srcDir so Nuxt 4 never moves it to app/
// (it switches as soon as an app/ folder appears: nuxt/nuxt packages/schema/src/config/common.ts).
export default defineNuxtConfig({
  srcDir: '.',
  compatibilityDate: '2026-11-01',
  devtools: { enabled: false },
  telemetry: false,
  modules: ['@nuxt/content', '@pinia/nuxt', 'pinia-plugin-persistedstate/nuxt', '@nuxtjs/tailwindcss', 'nuxt-auth-utils', '@nuxt/eslint'],
  css: ['~/assets/css/main.css'],
  app: {
    head: {
      htmlAttrs: { lang: 'en-IE' },
      title: 'Perpend',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1' },
        { name: 'description', content: 'Technical enquiries, calculations and the detail library of a masonry-system supplier.' },
      ],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  runtimeConfig: {
    db: {
      host: '127.0.0.1',
      port: 3307,
      name: 'perpend',
      user: 'perpend',
      password: 'perpend-local',
    },
    mailUrl: 'smtp://127.0.0.1:2525',
    mailFrom: 'Perpend technical desk <desk@perpend.invalid>',
    uploadDir: './var/uploads',
    // Base of the links in e-mails; never taken from the request's Host header (that would let a caller
    // point password-reset links at their own site).
    siteUrl: 'http://127.0.0.1:3000',
    mailPollMs: 3000,
    // The waiting-on-you reminder: after this many working days of waiting, swept this often (0 = off).
    reminderWorkingDays: 5,
    reminderSweepMs: 300_000,
    // E-mail in: the loopback SMTP listener's port (0 = off) and the provider hook's shared secret ('' = off).
    inboundSmtpPort: 0,
    inboundSecret: '',
    trustProxy: false,
    session: {
      name: 'perpend-session',
      maxAge: 60 * 60 * 12,
      cookie: { sameSite: 'lax', secure: true, httpOnly: true },
      // The session travels in its cookie only, never in a request header.
      sessionHeader: false,
    },
    public: {
      appVersion: process.env.npm_package_version || '0.1.0',
      demoNotice: true,
    },
  },
  content: {
    // better-sqlite3 12 is the connector that runs on Node 20 (13 crashes there).
    experimental: { sqliteConnector: 'better-sqlite3' },
  },
  eslint: { config: { stylistic: false } },
  typescript: { strict: true },
  experimental: {
    // Links fetch the code of the page they lead to when pointed at or focused, not as soon as they are on
    // screen: the library lists 86 links and the header a dozen, and fetching and running every page's code
    // at load kept a phone's main thread busy for a second after the page had painted.
    defaults: { nuxtLink: { prefetchOn: { visibility: false, interaction: true } } },
  },
  nitro: {
    experimental: { tasks: false },
    // Build assets are stored gzip- and brotli-compressed beside the originals and served by what the
    // browser accepts; rendered pages are compressed per response (server/plugins/compress-pages.ts).
    compressPublicAssets: { gzip: true, brotli: true },
  },
})
