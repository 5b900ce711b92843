// The offline queue of the cutter page: a cut log, a load or a return is saved on the phone
// first, then sent, and kept until the server has it; they are sent in the order they were made.
// Framework-free (storage and sender are injected) so it runs in Node's tests.

import type { CutLogInput } from '../shared/schemas/spindle'

/** The body of POST /api/cutters/:id/cuts, always with the time the cut finished, so a log
 *  sent late keeps its real time. */
export type CutBody = CutLogInput & { cutAt: string }

/** The body of a load or return: what the online form sends, plus the action's own key. */
export type ActionBody = { idempotencyKey: string } & Record<string, unknown>

export type QueuedState = 'waiting' | 'sending' | 'failed'

interface QueuedBase {
  /** The idempotency key: the same on every attempt, so the server does it once. */
  key: string
  cutterId: number
  cutterCode: string
  /** The user who made it; only their session may send it. */
  ownerId: number
  state: QueuedState
  attempts: number
  queuedAt: string
  /** Why it failed or is still waiting, in the server's words when it answered. */
  message?: string
  fields?: Record<string, string>
}

export interface QueuedCut extends QueuedBase {
  /** Absent on logs queued before loads and returns could wait too. */
  kind?: 'cut'
  /** Shown while the log waits, so the operator recognises it. */
  materialName: string
  body: CutBody
}

export interface QueuedAction extends QueuedBase {
  kind: 'load' | 'return'
  /** What the operator sees while it waits: "Load into Big router". */
  label: string
  body: ActionBody
}

export type QueuedItem = QueuedCut | QueuedAction
type NewItem<T> = T extends QueuedItem ? Omit<T, 'key' | 'state' | 'attempts' | 'queuedAt'> : never
export type NewQueuedItem = NewItem<QueuedItem>

/** Where each kind of item is sent, under /api/cutters/:id/. */
const ACTION_PATH = { cut: 'cuts', load: 'load', return: 'return' } as const
export const itemKind = (item: QueuedItem) => item.kind ?? 'cut'
export const isCut = (item: QueuedItem): item is QueuedCut => itemKind(item) === 'cut'

export type SendOutcome =
  | { kind: 'sent', status: number, data: unknown }
  /** No answer, or one that may pass (5xx, 408, 429): try again later with the same key. */
  | { kind: 'retry', status?: number, message: string }
  /** The server refused the log itself: sending it again would not help. */
  | { kind: 'rejected', status: number, message: string, fields: Record<string, string> }

export type CutSender = (item: QueuedItem) => Promise<SendOutcome>

export interface KeyValueStorage {
  getItem(key: string): string | null
  setItem(key: string, value: string): void
}

export type SubmitResult<T extends QueuedItem = QueuedCut> =
  | { state: 'sent', item: T, data: unknown }
  | { state: 'waiting' | 'failed', item: T }

export interface CutQueueOptions {
  storage: KeyValueStorage
  send: CutSender
  /** The signed-in user's id, or null when nobody is (then nothing is sent). */
  currentOwner: () => number | null
  storageKey?: string
  onChange?: (items: QueuedItem[]) => void
  onSent?: (item: QueuedItem, data: unknown) => void
  now?: () => Date
}

/** Bump the version when QueuedItem changes shape; an old phone's queue is then migrated or read as empty. */
export const CUT_QUEUE_STORAGE_KEY = 'kerfbook.cut-queue.v1'

/** A fresh idempotency key. randomUUID exists only on secure (https or localhost) pages; a phone on
 *  the shop's plain-HTTP network still has getRandomValues, so the same kind of key is built from it. */
export function newIdempotencyKey(): string {
  if (typeof crypto.randomUUID === 'function') return crypto.randomUUID()
  const b = crypto.getRandomValues(new Uint8Array(16))
  b[6] = (b[6]! & 0x0f) | 0x40 // version 4
  b[8] = (b[8]! & 0x3f) | 0x80 // RFC 4122 variant
  const hex = Array.from(b, (x) => x.toString(16).padStart(2, '0')).join('')
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`
}

export function isRetryableStatus(status: number): boolean {
  return status >= 500 || status === 408 || status === 429
}

export function createCutQueue(options: CutQueueOptions) {
  const storageKey = options.storageKey ?? CUT_QUEUE_STORAGE_KEY
  const now = options.now ?? (() => new Date())
  let items: QueuedItem[] = load()
  let running: Promise<void> | null = null
  const lastResult = new Map<string, SubmitResult<QueuedItem>>()

  function load(): QueuedItem[] {
    const raw = options.storage.getItem(storageKey)
    if (!raw) return []
    try {
      const parsed = JSON.parse(raw) as { items?: unknown }
      const list = Array.isArray(parsed.items) ? parsed.items.filter(isQueuedItem) : []
      // A send cut short by a reload never got its answer: it waits again, with the same key.
      return list.map((item) => (item.state === 'sending' ? { ...item, state: 'waiting' as const } : item))
    } catch (err) {
      console.warn('The saved cut-log queue could not be read; starting empty.', err)
      return []
    }
  }

  function save() {
    options.storage.setItem(storageKey, JSON.stringify({ items }))
    options.onChange?.(list())
  }

  function list(): QueuedItem[] {
    return items.map((item) => ({ ...item }))
  }

  function patch(key: string, change: Partial<QueuedBase> & { body?: CutBody | ActionBody, materialName?: string }) {
    items = items.map((item) => (item.key === key ? { ...item, ...change } as QueuedItem : item))
    save()
  }

  function find(key: string) {
    return items.find((item) => item.key === key)
  }

  function enqueue(input: NewQueuedItem): QueuedItem {
    const item = {
      ...input,
      key: input.body.idempotencyKey,
      state: 'waiting',
      attempts: 0,
      queuedAt: now().toISOString(),
    } as QueuedItem
    if (find(item.key)) throw new Error(`A cut log with the key ${item.key} is already queued.`)
    items = [...items, item]
    save()
    return { ...item }
  }

  /** Sends one item; answers whether the queue may go on to the next (not when this one must wait). */
  async function sendOne(item: QueuedItem): Promise<boolean> {
    patch(item.key, { state: 'sending', attempts: item.attempts + 1 })
    let outcome: SendOutcome
    try {
      outcome = await options.send({ ...item, attempts: item.attempts + 1 })
    } catch (err) {
      outcome = { kind: 'retry', message: err instanceof Error ? err.message : String(err) }
    }
    const current = find(item.key)
    if (!current) return true // discarded while in flight
    if (outcome.kind === 'sent') {
      items = items.filter((i) => i.key !== item.key)
      save()
      lastResult.set(item.key, { state: 'sent', item: current, data: outcome.data })
      options.onSent?.(current, outcome.data)
    } else if (outcome.kind === 'retry') {
      patch(item.key, { state: 'waiting', message: outcome.message, fields: undefined })
      lastResult.set(item.key, { state: 'waiting', item: find(item.key)! })
      return false
    } else {
      patch(item.key, { state: 'failed', message: outcome.message, fields: outcome.fields })
      lastResult.set(item.key, { state: 'failed', item: find(item.key)! })
    }
    return true
  }

  /** Sends every waiting item of the signed-in user once, oldest first, and stops at the first
   *  that must wait (so a cut never overtakes the load before it). One flush runs at a time: a
   *  call during a flush joins it, and an item queued meanwhile is picked up by it. */
  function flush(): Promise<void> {
    if (running) return running
    running = (async () => {
      // Yield once, so `running` is assigned before the loop can end and clear it: an empty
      // queue would otherwise finish synchronously and leave a settled promise behind for good.
      await null
      const tried = new Set<string>()
      try {
        for (;;) {
          const owner = options.currentOwner()
          const next = items.find((i) => i.state === 'waiting' && i.ownerId === owner && !tried.has(i.key))
          if (!next) break
          tried.add(next.key)
          if (!(await sendOne(next))) break
        }
      } finally {
        running = null
      }
    })()
    return running
  }

  /** Queues a new item and tries to send it (and any waiting before it) at once. */
  async function submit(input: NewQueuedItem): Promise<SubmitResult<QueuedItem>> {
    const item = enqueue(input)
    return settle(item.key)
  }

  async function settle(key: string): Promise<SubmitResult<QueuedItem>> {
    lastResult.delete(key)
    await flush()
    // A flush already under way when this log was queued may have ended just before reaching it.
    if (!lastResult.has(key) && find(key)?.state === 'waiting') await flush()
    const result = lastResult.get(key)
    if (result) return result
    const item = find(key)
    if (!item) throw new Error(`The cut log ${key} is no longer queued.`)
    return { state: item.state === 'failed' ? 'failed' : 'waiting', item: { ...item } }
  }

  /** After an edit (or to try a refused log again): the changed log waits again under the same key. */
  async function resubmit(key: string, change?: Partial<Pick<QueuedCut, 'body' | 'materialName'>>): Promise<SubmitResult<QueuedItem>> {
    const item = find(key)
    if (!item) throw new Error(`The cut log ${key} is no longer queued.`)
    if (change && !isCut(item)) throw new Error('Only a cut log can be corrected; discard a refused load or return instead.')
    const body = change?.body ? { ...change.body, idempotencyKey: key } : item.body
    patch(key, { ...change, body, state: 'waiting', message: undefined, fields: undefined })
    return settle(key)
  }

  function discard(key: string) {
    items = items.filter((i) => i.key !== key)
    save()
  }

  /** Another tab changed the stored queue: take its copy. */
  function reload() {
    items = load()
    options.onChange?.(list())
  }

  return { items: list, enqueue, submit, resubmit, discard, flush, reload, get flushing() { return running !== null } }
}

export type CutQueue = ReturnType<typeof createCutQueue>

function isQueuedItem(value: unknown): value is QueuedItem {
  const v = value as QueuedItem
  return typeof v === 'object' && v !== null && typeof v.key === 'string' && typeof v.cutterId === 'number'
    && typeof v.ownerId === 'number' && typeof v.body === 'object' && v.body !== null && typeof v.body.idempotencyKey === 'string'
    && (v.state === 'waiting' || v.state === 'sending' || v.state === 'failed')
    && (v.kind === undefined || v.kind === 'cut' || v.kind === 'load' || v.kind === 'return')
}

type FetchLike = (input: string, init: { method: string, headers: Record<string, string>, body: string, credentials: 'same-origin', signal?: AbortSignal }) => Promise<Pick<Response, 'status' | 'ok' | 'json' | 'statusText'>>

/** A sender over the platform's fetch. No response at all (offline, DNS, timeout) or a passing
 *  server trouble (5xx, 408, 429) means "retry"; any other refusal carries the server's message. */
export function createFetchSender(fetchImpl: FetchLike, options: { baseUrl?: string, timeoutMs?: number } = {}): CutSender {
  const timeoutMs = options.timeoutMs ?? 20_000
  return async (item) => {
    let response: Awaited<ReturnType<FetchLike>>
    try {
      response = await fetchImpl(`${options.baseUrl ?? ''}/api/cutters/${item.cutterId}/${ACTION_PATH[itemKind(item)]}`, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'accept': 'application/json' },
        body: JSON.stringify(item.body),
        credentials: 'same-origin',
        signal: typeof AbortSignal !== 'undefined' && 'timeout' in AbortSignal ? AbortSignal.timeout(timeoutMs) : undefined,
      })
    } catch {
      // The platform's reason ("Failed to fetch") means nothing to the operator.
      return { kind: 'retry', message: 'No connection to the server.' }
    }
    const data = await response.json().catch(() => null) as { message?: string, statusMessage?: string, data?: { fields?: Record<string, string> } } | null
    if (response.ok) return { kind: 'sent', status: response.status, data }
    const message = data?.message || data?.statusMessage || response.statusText || `The server answered ${response.status}.`
    if (isRetryableStatus(response.status)) return { kind: 'retry', status: response.status, message }
    return { kind: 'rejected', status: response.status, message, fields: data?.data?.fields ?? {} }
  }
}

/** Storage that lives only as long as the page, for browsers that refuse localStorage. */
export function memoryStorage(): KeyValueStorage {
  const map = new Map<string, string>()
  return { getItem: (k) => map.get(k) ?? null, setItem: (k, v) => { map.set(k, v) } }
}
