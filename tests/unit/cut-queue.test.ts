// The offline cut-log queue keeps its promise: no log is lost on a dropped connection, and none
// is counted twice. The fetch layer is a fake server whose network can fail and recover.
import { describe, expect, it } from 'vitest'
import { createCutQueue, createFetchSender, memoryStorage, newIdempotencyKey, type CutBody, type KeyValueStorage, type QueuedCut } from '../../utils/cut-queue'

type Network = 'up' | 'down' | 'drops-answers' | 'server-error'

/** A stand-in for POST /api/cutters/:id/cuts that honours idempotency keys like the contract says. */
function fakeServer() {
  const logs = new Map<string, { id: string, cutterId: number, body: CutBody }>()
  const requests: CutBody[] = []
  let network: Network = 'up'
  let nextId = 1

  const fetch = async (url: string, init: { body: string }) => {
    if (network === 'down') throw new TypeError('Failed to fetch')
    const body = JSON.parse(init.body) as CutBody
    requests.push(body)
    if (network === 'server-error') return Response.json({ statusCode: 503, message: 'The database is restarting.' }, { status: 503 })
    if (!(body.minutes > 0 && body.minutes <= 1440)) {
      return Response.json({ statusCode: 400, message: 'minutes: Too big: expected number to be <=1440', data: { fields: { minutes: 'Too big: expected number to be <=1440' } } }, { status: 400 })
    }
    const cutterId = Number(/\/api\/cutters\/(\d+)\/cuts$/.exec(url)![1])
    const existing = logs.get(body.idempotencyKey)
    const log = existing ?? { id: String(nextId++), cutterId, body }
    logs.set(body.idempotencyKey, log)
    // The server did its work, but the answer never reaches the phone.
    if (network === 'drops-answers') throw new TypeError('Network connection was lost')
    return Response.json({ log, lifeUsed: 0.1, minutesTotal: 10, status: 'in_spindle' }, { status: existing ? 200 : 201 })
  }

  return {
    fetch,
    logs,
    requests,
    setNetwork(n: Network) { network = n },
  }
}

let keyCounter = 0
function aCut(cutterId = 7, minutes = 15) {
  const idempotencyKey = `key-${String(++keyCounter).padStart(8, '0')}`
  return {
    cutterId,
    cutterCode: 'K7Q2M9P',
    ownerId: 3,
    materialName: 'MDF',
    body: { idempotencyKey, materialId: 2, minutes, outcome: 'clean' as const, cutAt: '2026-12-03T10:15:00.000Z' },
  }
}

function queueOver(storage: KeyValueStorage, server: ReturnType<typeof fakeServer>, owner: number | null = 3) {
  return createCutQueue({ storage, send: createFetchSender(server.fetch as any), currentOwner: () => owner })
}

describe('the cut-log queue', () => {
  it('sends a log at once when the network is up, and keeps nothing', async () => {
    const server = fakeServer()
    const queue = queueOver(memoryStorage(), server)
    const result = await queue.submit(aCut())
    expect(result.state).toBe('sent')
    expect(server.logs.size).toBe(1)
    expect(queue.items()).toEqual([])
  })

  it('keeps a log waiting while the network is down, and sends it once the network is back', async () => {
    const server = fakeServer()
    const queue = queueOver(memoryStorage(), server)
    server.setNetwork('down')
    const result = await queue.submit(aCut())
    expect(result.state).toBe('waiting')
    expect(queue.items()).toHaveLength(1)
    expect(queue.items()[0]!.state).toBe('waiting')

    await queue.flush() // still down: nothing changes, nothing is lost
    expect(queue.items()).toHaveLength(1)
    expect(server.logs.size).toBe(0)

    server.setNetwork('up')
    await queue.flush()
    expect(queue.items()).toEqual([])
    expect(server.logs.size).toBe(1)
  })

  it('keeps a log waiting through a passing server error (5xx) and sends it later', async () => {
    const server = fakeServer()
    const queue = queueOver(memoryStorage(), server)
    server.setNetwork('server-error')
    const result = await queue.submit(aCut())
    expect(result.state).toBe('waiting')
    expect(result.item.message).toBe('The database is restarting.')
    server.setNetwork('up')
    await queue.flush()
    expect(server.logs.size).toBe(1)
  })

  it('a retry after a lost answer reuses the key, so the server counts the log once', async () => {
    const server = fakeServer()
    const sent: unknown[] = []
    const queue = createCutQueue({
      storage: memoryStorage(), send: createFetchSender(server.fetch as any), currentOwner: () => 3,
      onSent: (_item, data) => sent.push(data),
    })
    server.setNetwork('drops-answers')
    const cut = aCut()
    expect((await queue.submit(cut)).state).toBe('waiting')
    expect(server.logs.size).toBe(1) // the server has it, the phone does not know

    server.setNetwork('up')
    await queue.flush()
    expect(server.requests.map((r) => r.idempotencyKey)).toEqual([cut.body.idempotencyKey, cut.body.idempotencyKey])
    expect(server.logs.size).toBe(1)
    expect(queue.items()).toEqual([])
    expect(sent).toHaveLength(1)
  })

  it('a refused log (400) is marked failed with the server\'s message and not retried', async () => {
    const server = fakeServer()
    const queue = queueOver(memoryStorage(), server)
    const result = await queue.submit(aCut(7, 5000))
    expect(result.state).toBe('failed')
    expect(result.item.fields).toEqual({ minutes: 'Too big: expected number to be <=1440' })
    expect(result.item.message).toContain('minutes')

    await queue.flush()
    await queue.flush()
    expect(server.requests).toHaveLength(1)
    expect(queue.items()[0]!.state).toBe('failed')
  })

  it('an edited refused log is sent again under the same key; a discarded one is gone', async () => {
    const server = fakeServer()
    const queue = queueOver(memoryStorage(), server)
    const bad = await queue.submit(aCut(7, 5000))
    const fixed = await queue.resubmit(bad.item.key, { body: { ...(bad.item as QueuedCut).body, minutes: 50 } })
    expect(fixed.state).toBe('sent')
    expect(server.logs.get(bad.item.key)!.body.minutes).toBe(50)

    const other = await queue.submit(aCut(7, 9999))
    queue.discard(other.item.key)
    expect(queue.items()).toEqual([])
  })

  it('survives a reload: a new queue over the same storage sends what the old one kept', async () => {
    const server = fakeServer()
    const storage = memoryStorage()
    server.setNetwork('down')
    const first = queueOver(storage, server)
    await first.submit(aCut(7, 10))
    await first.submit(aCut(8, 20))

    // The page reloads: the first queue is gone, only storage remains.
    server.setNetwork('up')
    const second = queueOver(storage, server)
    expect(second.items().map((i) => i.body.minutes)).toEqual([10, 20])
    await second.flush()
    expect(second.items()).toEqual([])
    expect([...server.logs.values()].map((l) => [l.cutterId, l.body.minutes])).toEqual([[7, 10], [8, 20]])
  })

  it('a send cut short by a reload waits again instead of being stuck as "sending"', async () => {
    const storage = memoryStorage()
    const never = createCutQueue({ storage, send: () => new Promise(() => {}), currentOwner: () => 3 })
    void never.submit(aCut())
    await new Promise((r) => setTimeout(r, 0))
    expect(never.items()[0]!.state).toBe('sending')

    const server = fakeServer()
    const after = queueOver(storage, server)
    expect(after.items()[0]!.state).toBe('waiting')
    await after.flush()
    expect(server.logs.size).toBe(1)
  })

  it('a flush of an empty queue (as at page load) does not block the next log', async () => {
    const server = fakeServer()
    const queue = queueOver(memoryStorage(), server)
    await queue.flush()
    expect(queue.flushing).toBe(false)
    expect((await queue.submit(aCut())).state).toBe('sent')
    expect(server.logs.size).toBe(1)
  })

  it('runs one flush at a time: calls during a flush join it, and each log is sent once', async () => {
    const server = fakeServer()
    let inFlight = 0
    let maxInFlight = 0
    const slowFetch = async (url: string, init: { body: string }) => {
      inFlight++
      maxInFlight = Math.max(maxInFlight, inFlight)
      await new Promise((r) => setTimeout(r, 5))
      try { return await server.fetch(url, init) } finally { inFlight-- }
    }
    const storage = memoryStorage()
    server.setNetwork('down')
    const queue = createCutQueue({ storage, send: createFetchSender(slowFetch as any), currentOwner: () => 3 })
    await queue.submit(aCut(7, 1))
    await queue.submit(aCut(7, 2))
    server.setNetwork('up')
    await Promise.all([queue.flush(), queue.flush(), queue.flush(), queue.submit(aCut(7, 3))])
    expect(maxInFlight).toBe(1)
    expect(server.requests.map((r) => r.minutes)).toEqual([1, 2, 3])
    expect(queue.items()).toEqual([])
  })

  it('sends only the signed-in user\'s logs, so a shared phone never logs under the wrong name', async () => {
    const server = fakeServer()
    const storage = memoryStorage()
    server.setNetwork('down')
    await queueOver(storage, server, 3).submit(aCut())
    server.setNetwork('up')
    const someoneElse = queueOver(storage, server, 4)
    await someoneElse.flush()
    expect(server.logs.size).toBe(0)
    await queueOver(storage, server, 3).flush()
    expect(server.logs.size).toBe(1)
  })

  it('makes version-4 keys even where randomUUID is missing (a plain-HTTP page on the shop network)', () => {
    const original = crypto.randomUUID
    try {
      Object.defineProperty(crypto, 'randomUUID', { value: undefined, configurable: true })
      const keys = new Set(Array.from({ length: 200 }, () => newIdempotencyKey()))
      expect(keys.size).toBe(200)
      // RFC 9562 section 5.4: version nibble 4, variant bits 10.
      for (const key of keys) expect(key).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/)
    } finally {
      Object.defineProperty(crypto, 'randomUUID', { value: original, configurable: true })
    }
  })

  it('reads an unreadable saved queue as empty instead of failing', () => {
    const storage = memoryStorage()
    storage.setItem('kerfbook.cut-queue.v1', '{not json')
    const server = fakeServer()
    const warn = console.warn
    console.warn = () => {}
    try {
      expect(queueOver(storage, server).items()).toEqual([])
    } finally {
      console.warn = warn
    }
  })
})
