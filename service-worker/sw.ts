/// <reference lib="webworker" />
// The service worker: keeps the app shell on the phone so that a label scanned where there is no
// signal still opens Kerfbook. Pages come from the network first (the server renders them with
// fresh data); without an answer, the precached app shell boots the app, which shows the cutter
// from the copy the phone keeps (composables/useOffline.ts). The API is never cached here: data
// offline comes from that copy, and writes wait in the phone's queue.
import { clientsClaim } from 'workbox-core'
import * as navigationPreload from 'workbox-navigation-preload'
import { cleanupOutdatedCaches, matchPrecache, precacheAndRoute } from 'workbox-precaching'
import { NavigationRoute, registerRoute } from 'workbox-routing'

declare let self: ServiceWorkerGlobalScope

/** The app shell: a page the server renders without data (nuxt.config.ts, routeRules). */
const SHELL = '/offline-shell'

precacheAndRoute(self.__WB_MANIFEST)
cleanupOutdatedCaches()
self.skipWaiting()
clientsClaim()
// The page's request starts while the worker itself starts, instead of after it.
navigationPreload.enable()

registerRoute(new NavigationRoute(async ({ request, event }) => {
  try {
    const preloaded = await (event as FetchEvent).preloadResponse as Response | undefined
    return preloaded ?? await fetch(request)
  } catch (err) {
    const shell = await matchPrecache(SHELL)
    if (shell) return shell
    throw err
  }
}, { denylist: [/^\/api\//, /^\/_/] }))
