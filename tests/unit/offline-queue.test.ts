// The phone's queue with loads and returns as well as cut logs: made without a connection, they
// reach the server later in the order they were made, each once, and a refusal is kept with the
// server's reason. The fake server below keeps one cutter's state as the routes do.
import { describe, expect, it } from 'vitest'
import { createCutQueue, createFetchSender, memoryStorage, type QueuedItem } from '../../utils/cut-queue'

function fakeCutterServer() {
  let online = false
  let status: 'in_crib' | 'in_spindle' = 'in_crib'
  const done = new Set<string>()
  const seen: string[] = []
  const fetch = async (url: string, init: { body: string }) => {
    if (!online) throw new TypeError('Failed to fetch')
    const action = /\/api\/cutters\/\d+\/(\w+)$/.exec(url)![1]!
    const body = JSON.parse(init.body) as { idempotencyKey: string, machineId?: number }
    seen.push(`${action}:${body.idempotencyKey}`)
    if (done.has(body.idempotencyKey)) return Response.json({ cutter: { status } })
    if (action === 'cuts' && status !== 'in_spindle') {
      return Response.json({ message: 'Cutter K7Q2M9P is in the crib, not in a machine. Load it first.' }, { status: 409 })
    }
    if (action === 'load') {
      if (body.machineId === 99) return Response.json({ message: 'Cutter K7Q2M9P is already loaded in Router 2. Return it to the crib first.' }, { status: 409 })
      status = 'in_spindle'
    }
    if (action === 'return') status = 'in_crib'
    done.add(body.idempotencyKey)
    return Response.json({ cutter: { status } }, { status: action === 'cuts' ? 201 : 200 })
  }
  return { fetch, seen, setOnline(v: boolean) { online = v }, get status() { return status } }
}

let n = 0
const k = (what: string) => `${what}-${String(++n).padStart(8, '0')}`
const base = { cutterId: 7, cutterCode: 'K7Q2M9P', ownerId: 3 }
const load = (machineId = 1) => ({ ...base, kind: 'load' as const, label: 'Load into Router 1', body: { machineId, idempotencyKey: k('load') } })
const ret = () => ({ ...base, kind: 'return' as const, label: 'Return to the crib', body: { idempotencyKey: k('return') } })
const cut = () => ({ ...base, materialName: 'MDF', body: { idempotencyKey: k('cut'), materialId: 2, minutes: 15, outcome: 'clean' as const, cutAt: '2026-12-03T10:15:00.000Z' } })

function queueOn(server: ReturnType<typeof fakeCutterServer>) {
  return createCutQueue({ storage: memoryStorage(), send: createFetchSender(server.fetch as never), currentOwner: () => 3 })
}
const kinds = (items: QueuedItem[]) => items.map((i) => i.kind ?? 'cut')

describe('loads and returns wait on the phone with the cut logs', () => {
  it('a load, a cut and a return made offline reach the server in that order, once each', async () => {
    const server = fakeCutterServer()
    const queue = queueOn(server)
    expect((await queue.submit(load())).state).toBe('waiting')
    expect((await queue.submit(cut())).state).toBe('waiting')
    expect((await queue.submit(ret())).state).toBe('waiting')
    expect(kinds(queue.items())).toEqual(['load', 'cut', 'return'])

    server.setOnline(true)
    await queue.flush()
    expect(server.seen.map((s) => s.split(':')[0])).toEqual(['load', 'cuts', 'return'])
    expect(queue.items()).toEqual([])
    expect(server.status).toBe('in_crib')
  })

  it('a cut never overtakes the load before it: one that must wait holds back those after it', async () => {
    const server = fakeCutterServer()
    const queue = queueOn(server)
    await queue.submit(load())
    await queue.submit(cut())
    // Each flush offline tries the first and stops there; nothing after it goes ahead.
    await queue.flush()
    expect(server.seen).toEqual([])
    expect(queue.items().map((i) => i.state)).toEqual(['waiting', 'waiting'])
    server.setOnline(true)
    await queue.flush()
    expect(server.seen.map((s) => s.split(':')[0])).toEqual(['load', 'cuts'])
  })

  it('each action keeps its own key on every attempt, so a retry is recognised', async () => {
    const server = fakeCutterServer()
    const queue = queueOn(server)
    const first = load()
    await queue.submit(first)
    await queue.submit(ret())
    server.setOnline(true)
    await queue.flush()
    const keys = server.seen.map((s) => s.split(':')[1])
    expect(keys[0]).toBe(first.body.idempotencyKey)
    expect(new Set(keys).size).toBe(2)
  })

  it('a load the server refuses when it finally arrives is kept with the server\'s reason, and is not retried', async () => {
    const server = fakeCutterServer()
    const queue = queueOn(server)
    await queue.submit(load(99))
    server.setOnline(true)
    await queue.flush()
    await queue.flush()
    expect(server.seen).toHaveLength(1)
    const [item] = queue.items()
    expect(item).toMatchObject({ kind: 'load', state: 'failed', message: 'Cutter K7Q2M9P is already loaded in Router 2. Return it to the crib first.' })
  })

  it('no connection is said in words, never as the platform\'s "Failed to fetch"', async () => {
    const server = fakeCutterServer()
    const queue = queueOn(server)
    const result = await queue.submit(ret())
    expect(result.item.message).toBe('No connection to the server.')
  })
})
