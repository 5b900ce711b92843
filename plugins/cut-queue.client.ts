// Starts the offline cut-log queue on every page load, so logs left waiting by an earlier
// visit (or a reload) are sent as soon as the app is up.
import { useCutQueueStore } from '~~/stores/cutQueue'

export default defineNuxtPlugin((nuxtApp) => {
  // After hydration, so the badge's first render matches the server's; in the app's context,
  // because the store reads the session.
  onNuxtReady(() => nuxtApp.runWithContext(() => useCutQueueStore().start()))
})
