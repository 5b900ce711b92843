// Cutter labels: the QR code on a label opens the cutter's page, read back by an independent
// decoder (jsQR) rather than by the library that drew it; the label sheet lists exactly the
// cutters asked for, in the caller's shop only.
import { beforeAll, describe, expect, it } from 'vitest'
import { newLabelCode } from '../../shared/kerf/label-code'
import { appDb } from '../support/db'
import { Client } from '../support/http'
import { decodeQrPng, decodeQrSvg } from '../support/qr'
import { makeShop, type TestShop } from '../support/shops'

let a: TestShop
let b: TestShop
const ids = { upcut: [] as number[], retired: 0, lost: 0, atRegrind: 0, vbit: 0, ordered: [] as number[], order: 0, upcutType: 0, otherShopCutter: 0, otherShopType: 0 }
const codes = new Map<number, string>()

const typeRow = (shopId: number, name: string) => ({
  shop_id: shopId, name, profile: 'square_end' as const, helix: 'upcut' as const, flutes: 2, cutting_diameter_mm: 6.35,
  shank_diameter_mm: 6.35, cutting_length_mm: 22, overall_length_mm: 64, rated_life_minutes: 900,
  min_usable_diameter_mm: 6, unit_cost_cents: 3000,
})

beforeAll(async () => {
  [a, b] = await Promise.all([makeShop('Labels A'), makeShop('Labels B')])
  const db = appDb()
  try {
    const upcut = await db.insertInto('cutter_types').values(typeRow(a.id, 'Upcut 1/4')).returning('id').executeTakeFirstOrThrow()
    const vbit = await db.insertInto('cutter_types').values({ ...typeRow(a.id, 'V 60'), profile: 'v_bit', v_angle_deg: 60, helix: 'straight', cutting_diameter_mm: 12.7, min_usable_diameter_mm: 12 })
      .returning('id').executeTakeFirstOrThrow()
    const otherType = await db.insertInto('cutter_types').values(typeRow(b.id, 'Upcut 1/4')).returning('id').executeTakeFirstOrThrow()
    const order = await db.insertInto('purchase_orders').values({ shop_id: a.id, status: 'received' }).returning('id').executeTakeFirstOrThrow()
    const line = await db.insertInto('purchase_order_lines').values({ shop_id: a.id, order_id: order.id, type_id: vbit.id, quantity: 2, received_quantity: 2, unit_cost_cents: 3000 })
      .returning('id').executeTakeFirstOrThrow()
    const cutter = (shopId: number, typeId: number, extra: Record<string, unknown> = {}) =>
      ({ shop_id: shopId, type_id: typeId, code: newLabelCode(), diameter_mm: 6.35, ...extra })
    const rows = await db.insertInto('cutters').values([
      cutter(a.id, upcut.id), cutter(a.id, upcut.id), cutter(a.id, upcut.id, { status: 'at_regrind' }),
      cutter(a.id, upcut.id, { status: 'retired', retired_reason: 'worn' }), cutter(a.id, upcut.id, { status: 'lost' }),
      cutter(a.id, vbit.id, { order_line_id: line.id }), cutter(a.id, vbit.id, { order_line_id: line.id }), cutter(a.id, vbit.id),
      cutter(b.id, otherType.id),
    ]).returning(['id', 'code']).execute()
    for (const r of rows) codes.set(r.id, r.code)
    const id = rows.map((r) => r.id)
    Object.assign(ids, {
      upcut: id.slice(0, 2), atRegrind: id[2], retired: id[3], lost: id[4], ordered: id.slice(5, 7), vbit: id[7],
      order: order.id, upcutType: upcut.id, otherShopCutter: id[8], otherShopType: otherType.id,
    })
  } finally {
    await db.destroy()
  }
})

async function getPng(client: Client, path: string) {
  const res = await client.raw(path)
  return { status: res.status, headers: res.headers, body: Buffer.from(await res.arrayBuffer()) }
}

describe('a cutter\'s label PNG', () => {
  it('holds the full URL of the cutter page, read back by jsQR', async () => {
    const id = ids.upcut[0]!
    const res = await getPng(a.operator, `/api/cutters/${id}/label.png`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('image/png')
    expect(res.headers.get('cache-control')).toBe('private, max-age=3600')
    expect(decodeQrPng(res.body)).toBe(`${process.env.KERFBOOK_TEST_URL}/c/${codes.get(id)}`)
  })

  it('is 404 for another shop\'s cutter and for one that does not exist', async () => {
    for (const id of [ids.otherShopCutter, 2 ** 31 - 1]) {
      const res = await a.crib.get(`/api/cutters/${id}/label.png`)
      expect(res.status).toBe(404)
      expect(res.body.message).toBe('No such cutter in your shop.')
    }
  })

  it('is 400 for an id that is not a number', async () => {
    const res = await a.crib.get('/api/cutters/abc/label.png')
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^id: /)
  })
})

describe('the label sheet\'s contents', () => {
  it('for a cutter type: its stock only, without retired or lost cutters', async () => {
    const res = await a.operator.get(`/api/labels?typeId=${ids.upcutType}`)
    expect(res.status).toBe(200)
    expect(res.body.title).toBe('Upcut 1/4')
    expect(res.body.labels.map((l: { id: number }) => l.id)).toEqual([...ids.upcut, ids.atRegrind])
    const first = res.body.labels[0]
    expect(first).toMatchObject({
      id: ids.upcut[0], code: codes.get(ids.upcut[0]!), url: `${process.env.KERFBOOK_TEST_URL}/c/${codes.get(ids.upcut[0]!)}`,
      typeName: 'Upcut 1/4', short: '6.35 mm · 1/4" · square end · 2F · upcut',
    })
    expect(decodeQrSvg(first.qrSvg)).toBe(first.url)
  })

  it('for a list of ids: those cutters in the order asked, whatever their status', async () => {
    const asked = [ids.vbit, ids.retired, ids.upcut[1]!]
    const res = await a.crib.get(`/api/labels?ids=${asked.join(',')}`)
    expect(res.status).toBe(200)
    expect(res.body.title).toBe('3 cutters')
    expect(res.body.labels.map((l: { id: number }) => l.id)).toEqual(asked)
    expect(res.body.labels[0].short).toBe('12.7 mm · 1/2" · V 60° · 2F · straight')
  })

  it('for a purchase order: the cutters received on it', async () => {
    const res = await a.crib.get(`/api/labels?orderId=${ids.order}`)
    expect(res.status).toBe(200)
    expect(res.body.title).toBe(`Purchase order ${ids.order}`)
    expect(res.body.labels.map((l: { id: number }) => l.id)).toEqual(ids.ordered)
  })

  it('never reaches another shop: its cutter, type or order answers 404', async () => {
    const cutter = await b.owner.get(`/api/labels?ids=${ids.upcut[0]}`)
    expect(cutter.status).toBe(404)
    expect(cutter.body.message).toBe('No such cutter in your shop.')
    const mixed = await a.owner.get(`/api/labels?ids=${ids.upcut[0]},${ids.otherShopCutter}`)
    expect(mixed.status).toBe(404)
    expect((await a.owner.get(`/api/labels?typeId=${ids.otherShopType}`)).body.message).toBe('No such cutter type in your shop.')
    expect((await b.owner.get(`/api/labels?orderId=${ids.order}`)).body.message).toBe('No such purchase order in your shop.')
  })

  it('needs exactly one way of choosing the cutters, and says which field is wrong', async () => {
    const none = await a.crib.get('/api/labels')
    expect(none.status).toBe(400)
    expect(none.body.message).toMatch(/ids, typeId or orderId/)
    const two = await a.crib.get(`/api/labels?ids=${ids.upcut[0]}&typeId=${ids.upcutType}`)
    expect(two.status).toBe(400)
    expect(two.body.message).toMatch(/^typeId: Give only one of/)
    const bad = await a.crib.get('/api/labels?ids=12,x')
    expect(bad.status).toBe(400)
    expect(bad.body.message).toMatch(/^ids: /)
  })

  it('prints at most 500 labels at a time', async () => {
    const many = Array.from({ length: 501 }, (_, i) => i + 1).join(',')
    const res = await a.crib.get(`/api/labels?ids=${many}`)
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/at most 500 labels/)
  })

  it('needs a session', async () => {
    const res = await new Client().get(`/api/labels?typeId=${ids.upcutType}`)
    expect(res.status).toBe(401)
  })
})
