// Kerfbook: the Nuxt application. Client folders sit at the project root (srcDir '.').
export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  srcDir: '.',
  devtools: { enabled: false },
  telemetry: false,
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/eslint'],
  css: [
    '@fontsource/atkinson-hyperlegible/400.css',
    '@fontsource/atkinson-hyperlegible/700.css',
    '@fontsource/barlow-condensed/600.css',
    '@fontsource/barlow-condensed/700.css',
    '~/assets/css/main.css',
  ],
  tailwindcss: { cssPath: false, configPath: 'tailwind.config.ts', viewer: false },
  app: {
    head: {
      htmlAttrs: { lang: 'en' },
      title: 'Kerfbook',
      meta: [
        { name: 'viewport', content: 'width=device-width, initial-scale=1, viewport-fit=cover' },
        { name: 'theme-color', content: '#12302b' },
        { name: 'description', content: 'Tooling crib and cutter-life tracker for CNC routing shops.' },
      ],
      link: [{ rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' }],
    },
  },
  runtimeConfig: {
    // Every value here is overridden at run time by NUXT_<NAME> environment variables.
    databaseUrl: '',
    // Connections per app instance. 20 rather than 10: with more requests in flight than
    // connections, commits queue in the app instead of being flushed together (npm run bench).
    databasePoolSize: 20,
    smtp: { host: '', port: 0, secure: false, user: '', pass: '', from: '' },
    trustProxy: false,
    // A secret that lets a scheduler outside the app run the nightly report by hand
    // (POST /api/tasks/report-nightly with "Authorization: Bearer <token>"); empty turns it off.
    taskToken: '',
    // Photos and CSV uploads: local disk by default, an S3-compatible bucket with driver 's3'.
    uploads: {
      driver: 'fs',
      dir: '.data/uploads',
      s3: { endpoint: '', region: '', bucket: '', accessKeyId: '', secretAccessKey: '' },
    },
    loginThrottle: { windowMinutes: 15, perAccount: 5, perAddress: 30 },
    session: { name: 'kerfbook-session', maxAge: 60 * 60 * 24 * 14 },
    public: { baseUrl: '' },
  },
  nitro: {
    experimental: { tasks: true },
    // server/utils has a folder per room; Nitro auto-imports only the top level of server/utils,
    // so each room is listed (platform: db, auth, validation, mail…; spindle; crib; insights).
    imports: {
      dirs: ['utils/platform', 'utils/spindle', 'utils/crib', 'utils/insights'].map((d) => `./server/${d}`),
    },
    // Checked every five minutes; each shop's own time zone and report time decide (and the
    // per-day record makes extra runs harmless).
    scheduledTasks: { '*/5 * * * *': ['report:nightly'] },
  },
  typescript: { strict: true },
  eslint: { config: { stylistic: false } },
})
