// Registers the service worker (service-worker/sw.ts) once the page is up. Its install fetches the
// app for use without signal; started later, it no longer competes with the page's own start on a
// slow link. Ours rather than @vite-pwa/nuxt's plugin, which loads workbox-window for this one call.
export default defineNuxtPlugin(() => {
  if (!('serviceWorker' in navigator)) return
  onNuxtReady(() => {
    // A new build's worker takes over a page the old one served (it skips waiting): load the page
    // again so that its code matches the files the new worker keeps.
    if (navigator.serviceWorker.controller) {
      navigator.serviceWorker.addEventListener('controllerchange', () => window.location.reload(), { once: true })
    }
    navigator.serviceWorker.register('/sw.js', { scope: '/' }).catch((err: unknown) => {
      console.warn('Kerfbook will not open without a connection on this device: the service worker did not register.', err)
    })
  })
})
