// A crib manager at a desk: turns a reorder suggestion into a purchase order, sends it, receives
// the delivery and opens its label sheet, then builds a batch of dull bits for the regrinder.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import { atPhoneWidth, DESKTOP, open, signIn, startJourney, JOURNEY_TIMEOUT, type Journey } from '../support/browser'
import { addSteadyUse } from '../support/demand'
import { waitForMail } from '../support/http'
import { addRegrindFixture } from '../support/regrind'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

const TYPE = 'Two-flute upcut 1/4"'
let shop: TestShop
let fx: SpindleFixture
let supplierEmail: string
let dull: Array<{ id: number, code: string }>
let journey: Journey

beforeAll(async () => {
  shop = await makeShop('Crib journey')
  fx = await addSpindleFixture(shop.id, 3, 600)
  supplierEmail = `sales-${shop.id}@example.com`
  const db = appDb()
  try {
    const supplier = await db.insertInto('suppliers').values({ shop_id: shop.id, name: 'Hollow Pine Tooling', email: supplierEmail, lead_time_days: 7 })
      .returning('id').executeTakeFirstOrThrow()
    await db.updateTable('cutter_types').set({ supplier_id: supplier.id, max_regrinds: 2, unit_cost_cents: 4000, pack_size: 2, supplier_part_number: 'HP-250-2F' })
      .where('id', '=', fx.typeId).execute()
  } finally {
    await db.destroy()
  }
  // 780 minutes of MDF a day for 90 days on a 600-minute type with two regrinds at 0.8 is
  // 1.3 / 2.6 = half a cutter a day: over a 7-day lead time the reorder point is 3.5, above the 3 in stock.
  await addSteadyUse({ shopId: shop.id, cutterId: fx.cutters[0]!.id, material: 'MDF', days: 90, minutesPerDay: 780, ratedLifeMinutes: 600 })
  const regrind = await addRegrindFixture(shop.id, `regrind-${shop.id}@example.com`)
  dull = await regrind.add([{ lifeUsed: 0.95 }, { flagged: 'dull', lifeUsed: 0.4 }])
  journey = await startJourney('crib', DESKTOP)
})
afterAll(() => journey?.close())

describe('the crib manager at a desk', { timeout: JOURNEY_TIMEOUT }, () => {
  it('orders from a suggestion, receives the delivery with its labels, and batches dull bits for resharpening', async () => {
    const { page, check } = journey
    await signIn(page, shop.emails.crib, TEST_PASSWORD)
    await check('home')

    // The reorder suggestion becomes a draft purchase order.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Crib' }).click()
    await page.getByRole('heading', { level: 1, name: 'Inventory' }).waitFor()
    await check('inventory')
    await page.getByRole('navigation', { name: 'Crib' }).getByRole('link', { name: 'Reorder' }).click()
    const suggestions = page.getByRole('region', { name: 'To order now (1)' })
    await suggestions.waitFor()
    await expect(suggestions.getByRole('checkbox', { name: TYPE }).isChecked()).resolves.toBe(true)
    await check('reorder')
    await suggestions.getByRole('button', { name: 'Create draft orders for 1 type' }).click()
    const made = page.getByRole('status').filter({ hasText: '1 draft order ready to check and send' })
    await made.waitFor()
    await made.getByRole('link', { name: /^open #\d+$/ }).click()
    await page.getByRole('heading', { name: 'Lines' }).waitFor()
    const orderId = Number(new URL(page.url()).pathname.split('/').at(-1))
    const number = (await page.getByRole('heading', { level: 1 }).innerText()).trim()
    await check('draft-order')

    // Four are enough this time; the supplier gets the order by e-mail.
    await page.getByLabel(`Quantity of ${TYPE}`).fill('4')
    page.once('dialog', (dialog) => void dialog.accept())
    await page.getByRole('button', { name: 'Send to the supplier' }).click()
    await page.getByRole('status').filter({ hasText: `${number} was e-mailed to ${supplierEmail}.` }).waitFor()
    const mail = await waitForMail(supplierEmail, number)
    expect(mail.text).toContain('4 x HP-250-2F')

    // The delivery arrives: receiving it opens the label sheet for exactly these four.
    const receive = page.locator('form').filter({ has: page.getByRole('heading', { name: 'Receive what arrived' }) })
    await receive.waitFor()
    await expect(receive.getByLabel('Arrived now').inputValue()).resolves.toBe('4')
    await check('order-sent')
    await receive.getByRole('button', { name: 'Receive and print labels' }).click()
    await page.waitForURL((url) => url.pathname === '/labels')
    await page.getByRole('button', { name: 'Print 4 labels' }).waitFor()
    await expect(page.getByRole('img', { name: /^QR code for / }).count()).resolves.toBe(4)
    // On each label of the preview the code stands clear of the type text under it.
    const gaps = await page.locator('.cutter-label').evaluateAll((labels) => labels.map((label) => {
      const code = label.querySelector('.cutter-label__code')!.getBoundingClientRect()
      const short = label.querySelector('.cutter-label__short')!.getBoundingClientRect()
      return Math.round(short.top - code.bottom)
    }))
    expect(gaps).toHaveLength(4)
    expect(gaps.every((gap) => gap >= 0), `gaps between code and text: ${gaps}`).toBe(true)
    await check('labels')

    const labelsPath = new URL(page.url()).pathname + new URL(page.url()).search
    const db = appDb()
    try {
      const order = await db.selectFrom('purchase_orders').select(['status', 'supplier_id', 'created_by']).where('id', '=', orderId).where('shop_id', '=', shop.id).executeTakeFirstOrThrow()
      expect(order).toMatchObject({ status: 'received', created_by: shop.ids.crib })
      const received = await db.selectFrom('cutters').innerJoin('purchase_order_lines as l', 'l.id', 'cutters.order_line_id')
        .select(['cutters.id', 'cutters.code', 'cutters.status', 'l.quantity']).where('l.order_id', '=', orderId).execute()
      expect(received).toHaveLength(4)
      expect(received.every((c) => c.status === 'in_crib' && c.quantity === 4)).toBe(true)
      const ids = new URL(page.url()).searchParams.get('ids')!.split(',').map(Number)
      expect(ids.sort()).toEqual(received.map((c) => c.id).sort())
      for (const c of received) await expect(page.getByText(c.code, { exact: true }).first().isVisible()).resolves.toBe(true)
    } finally {
      await db.destroy()
    }

    // The two dull bits go into a batch for the regrinder.
    await open(page, '/crib/regrind')
    const dueNow = page.getByRole('region', { name: 'Due now' })
    await dueNow.getByText('2 cutters flagged dull or past 90 % of their life').waitFor()
    await check('regrind-due')
    for (const c of dull) await dueNow.getByRole('checkbox', { name: `Pick ${c.code} for a batch` }).check()
    const build = page.getByRole('form', { name: 'Build a batch' })
    await build.getByLabel('Regrind supplier').selectOption({ label: 'Test Regrind Works' })
    await build.getByRole('button', { name: 'Build a batch of 2 cutters' }).click()
    const built = page.getByRole('status').filter({ hasText: /Draft batch \d+ holds 2 cutters/ })
    await built.waitFor()
    const batchId = Number((await built.innerText()).match(/Draft batch (\d+)/)![1])
    await check('regrind-batch')

    const db2 = appDb()
    try {
      const batch = await db2.selectFrom('regrind_batches').innerJoin('suppliers', 'suppliers.id', 'regrind_batches.supplier_id')
        .select(['regrind_batches.status', 'suppliers.name']).where('regrind_batches.id', '=', batchId).where('regrind_batches.shop_id', '=', shop.id).executeTakeFirstOrThrow()
      expect(batch).toEqual({ status: 'draft', name: 'Test Regrind Works' })
      const items = await db2.selectFrom('regrind_batch_items').select('cutter_id').where('batch_id', '=', batchId).execute()
      expect(items.map((i) => i.cutter_id).sort()).toEqual(dull.map((c) => c.id).sort())
    } finally {
      await db2.destroy()
    }

    await atPhoneWidth(journey, [
      { name: 'inventory', path: '/crib', heading: 'Inventory' },
      { name: 'reorder', path: '/crib/reorder', heading: 'Reorder' },
      { name: 'order', path: `/crib/orders/${orderId}`, heading: number },
      { name: 'labels', path: labelsPath, heading: '4 cutters' },
      { name: 'regrind', path: '/crib/regrind', heading: 'Resharpen' },
    ])
  })
})
