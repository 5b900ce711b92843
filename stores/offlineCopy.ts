// The copy of the shop this phone keeps for working without signal (shared/kerf/offline-copy.ts):
// read from localStorage at once, refreshed from the server whenever the phone is online, and
// cleared when its person signs out. Shared state: the cutter page, its load picker and cut form read it.
import { defineStore, skipHydrate } from 'pinia'
import { cutterFromCopy, type OfflineCopy } from '#shared/kerf/offline-copy'

export const OFFLINE_COPY_KEY = 'kerfbook.offline-copy.v1'
/** How often the copy is refreshed while the app is open and online. */
const REFRESH_EVERY_MS = 5 * 60_000

/** The copy kept on this device, whoever it belongs to; null when there is none or it cannot be read. */
export function readKeptCopy(): OfflineCopy | null {
  try {
    const raw = localStorage.getItem(OFFLINE_COPY_KEY)
    return raw ? JSON.parse(raw) as OfflineCopy : null
  } catch (err) {
    console.warn('The copy of the shop kept on this phone could not be read.', err)
    return null
  }
}

export const useOfflineCopyStore = defineStore('offlineCopy', () => {
  const { user } = useUserSession()
  // Never from the server's render: only this device knows what it keeps.
  const kept = skipHydrate(ref<OfflineCopy | null>(import.meta.client ? readKeptCopy() : null))
  /** The copy, when it is the signed-in person's. */
  const copy = computed(() => (kept.value && user.value && kept.value.user.id === user.value.id ? kept.value : null))
  let started = false
  let refreshing: Promise<void> | null = null

  function refresh(): Promise<void> {
    if (!user.value) return Promise.resolve()
    refreshing ??= (async () => {
      try {
        const fresh = await $fetch<OfflineCopy>('/api/offline/copy', { retry: 0 })
        // Someone may have signed out while it was on its way.
        if (!user.value || fresh.user.id !== user.value.id) return
        kept.value = fresh
        try {
          localStorage.setItem(OFFLINE_COPY_KEY, JSON.stringify(fresh))
        } catch (err) {
          console.warn('The copy of the shop could not be saved on this phone; it lasts until the page closes.', err)
        }
      } catch (err) {
        // Offline or refused: the copy kept so far stays, with its age shown where it is used.
        if (!isNoConnection(err)) console.warn('The copy of the shop was not refreshed.', apiProblem(err).message)
      } finally {
        refreshing = null
      }
    })()
    return refreshing
  }

  /** Forgets the copy (signing out): nothing of the shop stays for the next person on this device. */
  function clear() {
    kept.value = null
    try {
      localStorage.removeItem(OFFLINE_COPY_KEY)
    } catch (err) {
      console.warn('The copy of the shop could not be removed from this phone.', err)
    }
  }

  /** Keeps the copy fresh from now on: at once, when the connection returns, and every few minutes. Idempotent. */
  function start() {
    if (started || !import.meta.client) return
    started = true
    window.addEventListener('online', () => void refresh())
    setInterval(() => {
      if (document.visibilityState === 'visible' && navigator.onLine) void refresh()
    }, REFRESH_EVERY_MS)
    watch(() => user.value?.id, (id) => {
      if (kept.value && kept.value.user.id !== id) clear()
      if (id) void refresh()
    })
    void refresh()
  }

  const cutter = (code: string) => (copy.value ? cutterFromCopy(copy.value, code) : null)

  return { kept, copy, start, refresh, clear, cutter }
})
