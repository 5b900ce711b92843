// Kerfbook: the Nuxt application. Client folders sit at the project root (srcDir '.').
import type { Rollup } from 'vite'
import { EARLY_TAP_SCRIPT } from './utils/early-tap'
import { LEAVE_QUICKLY_SCRIPT } from './utils/leave-quickly'

/** A new one each build, so that phones fetch the app shell again with the new code. */
const SHELL_REVISION = Date.now().toString(36)

/** Where a label's QR code lands, and the layout around it when signed in. */
const CUTTER_PAGE = ['/pages/c/[code].vue', '/layouts/default.vue']
const chunkOf = new WeakMap<Rollup.GetModuleInfo, Map<string, string>>()

/**
 * Two chunks besides each page's own: "app", what the entry imports (Vue, Nuxt, the plugins), and
 * "cutter", everything else the cutter page and the signed-in layout import, directly or not. Left
 * to itself the build split the latter into some thirty files of under 4 KB shared in different
 * ways with other pages; on a phone's link each costs a request and its headers, and Lighthouse
 * counts each as holding up the first paint. Other signed-in pages load "cutter" too (the layout
 * needs most of it). The entry and the page modules stay chunks of their own, so that the build's
 * manifest still names what each page needs.
 */
function phoneChunks(id: string, { getModuleIds, getModuleInfo }: Rollup.ManualChunkMeta): string | undefined {
  let chunks = chunkOf.get(getModuleInfo)
  if (!chunks) {
    const reach = (roots: string[]) => {
      const seen = new Set<string>()
      const todo = [...roots]
      while (todo.length) {
        const next = todo.pop()!
        if (seen.has(next)) continue
        seen.add(next)
        todo.push(...(getModuleInfo(next)?.importedIds ?? []))
      }
      return seen
    }
    const ids = [...getModuleIds()]
    const entries = ids.filter((m) => getModuleInfo(m)?.isEntry)
    const pages = ids.filter((m) => CUTTER_PAGE.some((p) => m.endsWith(p)))
    chunks = new Map()
    for (const m of reach(pages)) chunks.set(m, 'cutter')
    for (const m of reach(entries)) chunks.set(m, 'app')
    for (const m of [...entries, ...pages]) chunks.delete(m)
    chunkOf.set(getModuleInfo, chunks)
  }
  return chunks.get(id)
}

export default defineNuxtConfig({
  compatibilityDate: '2026-11-01',
  srcDir: '.',
  devtools: { enabled: false },
  telemetry: false,
  modules: ['@nuxtjs/tailwindcss', '@pinia/nuxt', 'nuxt-auth-utils', '@nuxt/eslint', '@vite-pwa/nuxt'],
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
      link: [
        { rel: 'icon', type: 'image/svg+xml', href: '/favicon.svg' },
        { rel: 'apple-touch-icon', href: '/icons/apple-touch-icon-180.png' },
        { rel: 'manifest', href: '/manifest.webmanifest' },
      ],
      // Keeps a tap on the cutter page's buttons made before the page is interactive (utils/early-tap.ts);
      // lets the next page start without waiting for vue-router to save the scroll position (utils/leave-quickly.ts).
      script: [{ innerHTML: EARLY_TAP_SCRIPT, tagPosition: 'head' }, { innerHTML: LEAVE_QUICKLY_SCRIPT, tagPosition: 'head' }],
    },
  },
  runtimeConfig: {
    // Every value here is overridden at run time by NUXT_<NAME> environment variables.
    databaseUrl: '',
    // Connections per app instance. 20 rather than 10: with more requests in flight than
    // connections, commits queue in the app instead of being flushed together (npm run bench).
    databasePoolSize: 20,
    smtp: { host: '', port: 0, secure: false, user: '', pass: '', from: '' },
    // true behind one proxy, or the number of proxies in front (each adds one X-Forwarded-For entry).
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
    // perAccount counts failures per account from one address; perAccountEverywhere from all of them.
    // Mail a shop sends to others per hour; links to one address per hour, and how long a link
    // stays "fresh" (a new request neither sends another nor cancels it).
    mailLimits: { perShopPerHour: 100, perAddressPerHour: 3, freshLinkMinutes: 10 },
    loginThrottle: { windowMinutes: 15, perAccount: 5, perAddress: 30, perAccountEverywhere: 50 },
    // cookie.secure: NUXT_SESSION_COOKIE_SECURE=false lets a phone sign in over plain HTTP on a
    // shop's own network; keep it true anywhere else.
    session: { name: 'kerfbook-session', maxAge: 60 * 60 * 24 * 14, cookie: { sameSite: 'lax', secure: true, httpOnly: true } },
    public: { baseUrl: '' },
  },
  routeRules: {
    // The app shell the service worker keeps: the app with no page data, which boots on whatever
    // address the phone opened and shows what it keeps offline.
    '/offline-shell': { ssr: false },
    // Build assets carry their content's hash in their names: they never change, so keep them a year.
    '/_nuxt/**': { headers: { 'cache-control': 'public, max-age=31536000, immutable' } },
    // Phones look for a new service worker on every visit.
    '/sw.js': { headers: { 'cache-control': 'no-cache' } },
  },
  pwa: {
    strategies: 'injectManifest',
    srcDir: 'service-worker',
    filename: 'sw.ts',
    registerType: 'autoUpdate',
    injectRegister: false,
    manifest: {
      name: 'Kerfbook',
      short_name: 'Kerfbook',
      description: 'Tooling crib and cutter-life tracker for CNC routing shops.',
      lang: 'en',
      start_url: '/',
      scope: '/',
      display: 'standalone',
      background_color: '#f6f4ee',
      theme_color: '#12302b',
      icons: [
        { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png' },
        { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png' },
        { src: '/icons/maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
      ],
    },
    injectManifest: {
      globPatterns: ['_nuxt/**/*.{js,css,woff2}', 'favicon.svg', 'icons/*.png'],
      additionalManifestEntries: [{ url: '/offline-shell', revision: SHELL_REVISION }],
    },
    // plugins/service-worker.client.ts registers it, without workbox-window.
    client: { installPrompt: false, registerPlugin: false },
    devOptions: { enabled: false },
  },
  nitro: {
    experimental: { tasks: true },
    // Static files are stored brotli- and gzip-compressed beside the originals and sent as the
    // browser accepts; the pages and JSON made per request are compressed by server/plugins/compression.ts.
    compressPublicAssets: { gzip: true, brotli: true },
    // server/utils has a folder per room; Nitro auto-imports only the top level of server/utils,
    // so each room is listed (platform: db, auth, validation, mail…; spindle; crib; insights).
    imports: {
      dirs: ['utils/platform', 'utils/spindle', 'utils/crib', 'utils/insights'].map((d) => `./server/${d}`),
    },
    // Checked every five minutes; each shop's own time zone and report time decide (and the
    // per-day record makes extra runs harmless).
    scheduledTasks: { '*/5 * * * *': ['report:nightly'] },
  },
  // npm run analyze:client: which modules make up each chunk the phone downloads (scripts/analyze-client.ts).
  build: { analyze: process.env.KERFBOOK_ANALYZE === '1' && { enabled: true, template: 'raw-data', filename: '.data/analyze-{name}.json' } },
  experimental: {
    // A link fetches its page's code when a finger or pointer reaches it, not when it scrolls into
    // view: a shop's network is slow and metered, and code fetched for pages the operator never
    // opens also runs on the phone's main thread while the cutter page is starting.
    defaults: { nuxtLink: { prefetchOn: { visibility: false, interaction: true } } },
  },
  vite: {
    // The cutter page's code came in some thirty files of under 4 KB: on a phone's link each costs a
    // request and its headers, and Lighthouse counts each as holding up the first paint.
    $client: { build: { rollupOptions: { output: { manualChunks: phoneChunks } } } },
    // Every component is written with <script setup>: Vue's Options API (data, methods, mixins…) is
    // left out of the runtime the phone downloads.
    vue: { features: { optionsAPI: false } },
  },
  typescript: { strict: true },
  eslint: { config: { stylistic: false } },
})
