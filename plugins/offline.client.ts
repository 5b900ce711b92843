// Working without signal. When the phone opens Kerfbook with no connection, the service worker
// hands it the app shell, which cannot read the session from the server: the copy of the shop
// kept on this phone says who was signed in here (signing out removes it), so the cutter pages
// open from it. Online, the copy is kept fresh, and every page's data is fetched again when the
// connection returns, so a page that failed for lack of it recovers by itself.
import { readKeptCopy, useOfflineCopyStore } from '~~/stores/offlineCopy'

export default defineNuxtPlugin({
  name: 'kerfbook:offline',
  setup(nuxtApp) {
    const { session } = useUserSession()
    // null (not an empty session) means the session could not be read at all.
    if (!nuxtApp.payload.serverRendered && session.value === null) {
      const kept = readKeptCopy()
      if (kept) session.value = { id: 'kept-on-this-phone', user: kept.user }
    }
    window.addEventListener('online', () => void refreshNuxtData())
    onNuxtReady(() => nuxtApp.runWithContext(() => useOfflineCopyStore().start()))
  },
})
