// The shop's own details (address, phone, reply-to e-mail, currency), carried by the orders and
// regrind batches it sends; and their numbers, counted per shop from 1.
import { beforeAll, describe, expect, it } from 'vitest'
import { waitForMail } from '../support/http'
import { makeShop, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let other: TestShop
let fx: SpindleFixture
let supplierId: number
let supplierEmail: string

beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Details'), makeShop('Details elsewhere')])
  fx = await addSpindleFixture(shop.id, 4)
  supplierEmail = `orders-${shop.id}@example.com`
  supplierId = (await shop.crib.post('/api/suppliers', { name: 'Hollow Pine Tools', email: supplierEmail })).body.id
})

describe('the shop\'s own details', () => {
  it('the owner sets the address, phone, reply-to e-mail and currency; the settings answer them', async () => {
    const res = await shop.owner.patch('/api/shop', {
      address: '  12 Mill Lane  \n\nUnit 4\r\nRiverton ON K0A 1A0 ', phone: '+1 (555) 010-0199', replyEmail: 'Crib@Example.com', currency: 'CAD',
    })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ address: '12 Mill Lane\nUnit 4\nRiverton ON K0A 1A0', phone: '+1 (555) 010-0199', replyEmail: 'crib@example.com', currency: 'CAD' })
    expect((await shop.operator.get('/api/me')).body.shop.currency).toBe('CAD')
  })

  it.each([
    ['a currency not offered', { currency: 'JPY' }, 'currency'],
    ['a phone with letters', { phone: 'call me' }, 'phone'],
    ['a reply address that is no e-mail', { replyEmail: 'crib at shop' }, 'replyEmail'],
    ['an address over 500 characters', { address: 'x'.repeat(501) }, 'address'],
  ])('%s answers 400 naming the field and changes nothing', async (_label, body, field) => {
    const res = await shop.owner.patch('/api/shop', body)
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields)).toContain(field)
    expect((await shop.owner.get('/api/shop')).body.currency).toBe('CAD')
  })

  it('only the owner changes them', async () => {
    expect((await shop.crib.patch('/api/shop', { currency: 'EUR' })).status).toBe(403)
  })
})

describe('numbers counted per shop', () => {
  it('a new shop\'s first order is PO-00001 and its second PO-00002, whatever other shops did', async () => {
    const first = await shop.crib.post('/api/orders', { supplierId, lines: [{ typeId: fx.typeId, quantity: 2 }] })
    expect(first.status).toBe(201)
    expect((await shop.crib.get(`/api/orders/${first.body.id}`)).body.number).toBe('PO-00001')
    const second = await shop.crib.post('/api/orders', { supplierId, lines: [{ typeId: fx.typeId, quantity: 1 }] })
    expect((await shop.crib.get(`/api/orders/${second.body.id}`)).body.number).toBe('PO-00002')
    const otherSupplier = (await other.crib.post('/api/suppliers', { name: 'Elsewhere Tools' })).body.id
    const otherFx = await addSpindleFixture(other.id, 1)
    const theirs = await other.crib.post('/api/orders', { supplierId: otherSupplier, lines: [{ typeId: otherFx.typeId, quantity: 1 }] })
    expect((await other.crib.get(`/api/orders/${theirs.body.id}`)).body.number).toBe('PO-00001')
  })

  it('orders made at the same moment get different numbers', async () => {
    const made = await Promise.all(Array.from({ length: 6 }, () => shop.crib.post('/api/orders', { supplierId, lines: [{ typeId: fx.typeId, quantity: 1 }] })))
    expect(made.map((r) => r.status)).toEqual(Array(6).fill(201))
    const list = (await shop.crib.get('/api/orders')).body as Array<{ number: string }>
    expect(new Set(list.map((o) => o.number)).size).toBe(list.length)
    expect(list.map((o) => o.number).sort()).toEqual(Array.from({ length: 8 }, (_, k) => `PO-0000${k + 1}`))
  })

  it('the first regrind batch is batch 1', async () => {
    const res = await shop.crib.post('/api/regrind/batches', { cutterIds: [fx.cutters[0]!.id], supplierId })
    expect(res.status).toBe(201)
    expect(res.body.batch.number).toBe(1)
  })
})

describe('orders and batches carry the address', () => {
  it('the order e-mail names the shop\'s address and shows money in its currency; the order keeps the address it went out with', async () => {
    const made = (await shop.crib.post('/api/orders', { supplierId, lines: [{ typeId: fx.typeId, quantity: 100 }] })).body
    const sent = await shop.crib.post(`/api/orders/${made.id}/send`)
    expect(sent.status).toBe(200)
    expect(sent.body.shipTo).toBe('12 Mill Lane\nUnit 4\nRiverton ON K0A 1A0')
    const mail = await waitForMail(supplierEmail, sent.body.number)
    expect(mail.text).toContain('Deliver to:\n' + `${(await shop.owner.get('/api/shop')).body.name}\n12 Mill Lane\nUnit 4\nRiverton ON K0A 1A0\nPhone +1 (555) 010-0199`)
    // 100 cutters at the fixture's 30.00 each, with thousands grouped and the Canadian symbol.
    expect(mail.text).toContain('Order total: CA$3,000.00')
    await shop.owner.patch('/api/shop', { address: '1 New Road' })
    expect((await shop.crib.get(`/api/orders/${made.id}`)).body.shipTo).toBe('12 Mill Lane\nUnit 4\nRiverton ON K0A 1A0')
  })

  it('a sent regrind batch keeps the address and its e-mail asks for the bits back there', async () => {
    const drafted = (await shop.crib.post('/api/regrind/batches', { cutterIds: [fx.cutters[1]!.id], supplierId })).body.batch
    const sent = await shop.crib.post(`/api/regrind/batches/${drafted.id}/send`, { emailSupplier: true })
    expect(sent.status).toBe(200)
    expect(sent.body.batch.shipTo).toBe('1 New Road')
    const mail = await waitForMail(supplierEmail, `(batch ${drafted.number})`)
    expect(mail.text).toContain('Please send them back to: ')
    expect(mail.text).toContain('1 New Road, Phone +1 (555) 010-0199')
  })
})
