// The offline queue as shared client state: the cutter page logs cuts, loads and returns through
// it, the layout's badge counts what waits. The queue itself (utils/cut-queue.ts) keeps it in localStorage.
import { defineStore } from 'pinia'
import {
  createCutQueue, createFetchSender, CUT_QUEUE_STORAGE_KEY, memoryStorage, newIdempotencyKey,
  type ActionBody, type CutBody, type CutQueue, type KeyValueStorage, type QueuedAction, type QueuedCut, type QueuedItem, type SubmitResult,
} from '~/utils/cut-queue'

/** How often waiting logs are tried again while any wait. */
const RETRY_EVERY_MS = 20_000

export interface NewCut {
  cutterId: number
  cutterCode: string
  materialName: string
  body: CutBody
}

export interface NewAction {
  kind: 'load' | 'return'
  cutterId: number
  cutterCode: string
  label: string
  /** The body the online form sends; the action's key is added here. */
  body: Record<string, unknown>
}

export interface SentCut { key: string, cutterId: number, cutterCode: string, data: unknown }

export const useCutQueueStore = defineStore('cutQueue', () => {
  const { user } = useUserSession()
  const all = ref<QueuedItem[]>([])
  /** The last log the server took in the background, for pages to refresh what they show. */
  const lastSent = ref<SentCut | null>(null)
  // Logs whose sender is waiting for the answer itself: their outcome is told to that caller.
  const inHand = new Set<string>()
  let queue: CutQueue | null = null
  let timer: ReturnType<typeof setInterval> | null = null

  const mine = computed(() => all.value.filter((item) => item.ownerId === user.value?.id))
  const waiting = computed(() => mine.value.filter((item) => item.state !== 'failed'))
  const failed = computed(() => mine.value.filter((item) => item.state === 'failed'))
  const forCutter = (cutterId: number) => mine.value.filter((item) => item.cutterId === cutterId)

  function browserStorage(): KeyValueStorage {
    try {
      const probe = `${CUT_QUEUE_STORAGE_KEY}.probe`
      localStorage.setItem(probe, '1')
      localStorage.removeItem(probe)
      return localStorage
    } catch (err) {
      console.warn('localStorage is not available; queued cut logs last only until the page closes.', err)
      return memoryStorage()
    }
  }

  /** Starts the queue in the browser: reads what a previous page left, and keeps trying. Idempotent. */
  function start(): CutQueue {
    if (queue) return queue
    if (!import.meta.client) throw new Error('The cut-log queue runs in the browser only.')
    queue = createCutQueue({
      storage: browserStorage(),
      send: createFetchSender(window.fetch.bind(window)),
      currentOwner: () => user.value?.id ?? null,
      onChange: (items) => {
        all.value = items
        keepTrying()
      },
      onSent: (item, data) => {
        if (!inHand.has(item.key)) lastSent.value = { key: item.key, cutterId: item.cutterId, cutterCode: item.cutterCode, data }
      },
    })
    all.value = queue.items()
    window.addEventListener('online', () => void queue?.flush())
    document.addEventListener('visibilitychange', () => {
      if (document.visibilityState === 'visible') void queue?.flush()
    })
    window.addEventListener('storage', (event) => {
      if (event.key === CUT_QUEUE_STORAGE_KEY) queue?.reload()
    })
    // Someone signing in on this phone may have logs of their own waiting.
    watch(() => user.value?.id, () => void queue?.flush())
    keepTrying()
    void queue.flush()
    return queue
  }

  function keepTrying() {
    const anyWaiting = all.value.some((item) => item.state !== 'failed')
    if (anyWaiting && !timer) {
      timer = setInterval(() => void queue?.flush(), RETRY_EVERY_MS)
    } else if (!anyWaiting && timer) {
      clearInterval(timer)
      timer = null
    }
  }

  async function submit(cut: NewCut): Promise<SubmitResult<QueuedCut>> {
    const ownerId = user.value?.id
    if (!ownerId) throw new Error('Sign in to log a cut.')
    return holding(cut.body.idempotencyKey, () => start().submit({ ...cut, ownerId })) as Promise<SubmitResult<QueuedCut>>
  }

  /** A load or return, sent now or, without a connection, after the items before it. */
  async function submitAction(action: NewAction): Promise<SubmitResult<QueuedAction>> {
    const ownerId = user.value?.id
    if (!ownerId) throw new Error('Sign in first.')
    const body: ActionBody = { ...action.body, idempotencyKey: newIdempotencyKey() }
    return holding(body.idempotencyKey, () => start().submit({ ...action, body, ownerId })) as Promise<SubmitResult<QueuedAction>>
  }

  async function holding<T>(key: string, send: () => Promise<T>): Promise<T> {
    inHand.add(key)
    try {
      return await send()
    } finally {
      inHand.delete(key)
    }
  }

  /** A refused item sent again (a cut log with the operator's corrections). */
  const resubmit = (key: string, change?: { body: CutBody, materialName: string }) =>
    holding(key, () => start().resubmit(key, change)) as Promise<SubmitResult<QueuedCut>>
  const discard = (key: string) => start().discard(key)
  const flush = () => start().flush()

  return { all, mine, waiting, failed, lastSent, forCutter, start, submit, submitAction, resubmit, discard, flush }
})
