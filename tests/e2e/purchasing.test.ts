// A crib manager at a desk starts a purchase order from scratch, sends it, downloads its PDF
// (read back with pdf-parse: the lines, the total and the delivery address are in it), then
// receives a regrind batch in two parts.
import { readFile } from 'node:fs/promises'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import { atPhoneWidth, DESKTOP, open, signIn, startJourney, JOURNEY_TIMEOUT, type Journey } from '../support/browser'
import { waitForMail } from '../support/http'
import { pdfText } from '../support/pdf'
import { addRegrindFixture, cutterState, type RegrindFixture } from '../support/regrind'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'

const REGRINDABLE = 'Two-flute upcut 1/4" regrindable'
const ENGRAVER = 'V-bit 90 degree sign engraver'
let shop: TestShop
let fx: RegrindFixture
let shopName: string
let batchId: number
let batchNumber: number
let out: Array<{ id: number, code: string }>
let journey: Journey

beforeAll(async () => {
  shop = await makeShop('Purchasing journey')
  fx = await addRegrindFixture(shop.id, `regrind-${shop.id}@example.com`)
  const db = appDb()
  try {
    shopName = (await db.selectFrom('shops').select('name').where('id', '=', shop.id).executeTakeFirstOrThrow()).name
    // A type from no supplier in particular: an order from scratch may carry any type.
    await db.insertInto('cutter_types').values({
      shop_id: shop.id, name: ENGRAVER, profile: 'v_bit', v_angle_deg: 90, helix: 'straight', flutes: 2, cutting_diameter_mm: 12.7,
      shank_diameter_mm: 6.35, cutting_length_mm: 8, overall_length_mm: 50, rated_life_minutes: 900, min_usable_diameter_mm: 12,
      unit_cost_cents: 2900, supplier_part_number: 'VE-90',
    }).execute()
  } finally {
    await db.destroy()
  }
  // Two dull bits already out at the regrinder in one batch.
  out = await fx.add([{ lifeUsed: 0.95 }, { lifeUsed: 0.95 }])
  const batch = await shop.crib.post('/api/regrind/batches', { cutterIds: out.map((c) => c.id), supplierId: fx.supplier.id })
  batchId = batch.body.batch.id
  batchNumber = batch.body.batch.number
  expect((await shop.crib.post(`/api/regrind/batches/${batchId}/send`, {})).status).toBe(200)
  journey = await startJourney('purchasing', DESKTOP)
})
afterAll(() => journey?.close())

describe('purchasing at a desk', { timeout: JOURNEY_TIMEOUT }, () => {
  it('starts an order from scratch, sends it, reads back its PDF, and receives a regrind batch in two parts', async () => {
    const { page, check } = journey
    await signIn(page, shop.emails.crib, TEST_PASSWORD)

    // A new order from scratch: any supplier, any types, quantities and prices.
    await open(page, '/crib/orders')
    await page.getByRole('link', { name: 'New order' }).click()
    await page.getByRole('heading', { level: 1, name: 'New purchase order' }).waitFor()
    await page.getByLabel('Supplier', { exact: true }).selectOption({ label: 'Test Regrind Works' })
    await page.getByLabel('Add a cutter type').selectOption({ label: REGRINDABLE })
    await page.getByRole('button', { name: 'Add the line' }).click()
    await page.getByLabel('Add a cutter type').selectOption({ label: `${ENGRAVER} (another supplier's)` })
    await page.getByRole('button', { name: 'Add the line' }).click()
    await page.getByLabel(`Quantity of ${REGRINDABLE}`).fill('5')
    await page.getByLabel(`Unit price ($) of ${REGRINDABLE}`).fill('37.25')
    await page.getByLabel(`Quantity of ${ENGRAVER}`).fill('2')
    // 5 × $37.25 + 2 × $29.00 = $186.25 + $58.00 = $244.25
    await page.getByText('Total $244.25').waitFor()
    await page.getByLabel('Note to the supplier').fill('Deliver to the side door')
    await check('new-order')
    await page.getByRole('button', { name: 'Save the draft' }).click()
    await page.waitForURL((url) => /^\/crib\/orders\/\d+$/.test(url.pathname))
    const heading = page.getByRole('heading', { level: 1, name: /^PO-\d+$/ })
    await heading.waitFor()
    const number = (await heading.innerText()).trim()

    // Edited before sending: one more engraver.
    await page.getByLabel(`Quantity of ${ENGRAVER}`).fill('3')
    await page.getByRole('button', { name: 'Save the draft' }).click()
    await page.getByRole('status').filter({ hasText: 'Saved.' }).waitFor()
    await page.getByText('Total $273.25').waitFor()
    page.once('dialog', (dialog) => void dialog.accept())
    await page.getByRole('button', { name: 'Send to the supplier' }).click()
    await page.getByRole('status').filter({ hasText: `${number} was e-mailed to ${fx.supplier.email}.` }).waitFor()
    const mail = await waitForMail(fx.supplier.email, number)
    expect(mail.attachments.map((a) => a.filename)).toEqual([`purchase-order-${number}.pdf`])
    await check('order-sent')

    // The PDF downloads from the order page and reads back with its lines, total and address.
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download the PDF' }).click()])
    expect(download.suggestedFilename()).toBe(`purchase-order-${number}.pdf`)
    const text = await pdfText(await readFile((await download.path())!))
    const lines = text.split('\n').map((l) => l.trim())
    expect(lines.some((l) => /^5\b.*Two-flute upcut 1\/4" regrindable.*\$37\.25.*\$186\.25$/.test(l)), text).toBe(true)
    expect(lines.some((l) => /^3\b.*VE-90.*V-bit 90 degree sign engraver.*\$29\.00.*\$87\.00$/.test(l)), text).toBe(true)
    expect(text).toContain('Order total: $273.25')
    expect(text).toContain('DELIVER TO')
    expect(text).toContain(shopName)
    expect(text).toContain('Deliver to the side door')

    // The regrind batch comes back in two parts.
    await open(page, '/crib/regrind')
    const batch = page.getByRole('article', { name: `Batch ${batchNumber}` })
    await batch.getByText('2 of 2 still out').waitFor()
    await batch.getByRole('button', { name: 'Receive what came back…' }).click()
    await batch.getByRole('group', { name: `What happened to ${out[1]!.code}` }).getByLabel('Still out').check()
    await check('regrind-receive-part')
    await batch.getByRole('button', { name: 'Review the receipt' }).click()
    await batch.getByText('1 stay out at the regrinder.').waitFor()
    await batch.getByRole('button', { name: 'Receive 1 cutter' }).click()
    await page.getByRole('status').filter({ hasText: `Batch ${batchNumber}: 1 back in the crib, 1 still out.` }).waitFor()
    await batch.getByText('1 of 2 still out').waitFor()
    expect((await cutterState(out[0]!.id)).cutter.status).toBe('in_crib')
    expect((await cutterState(out[1]!.id)).cutter.status).toBe('at_regrind')
    await check('regrind-one-back')

    await batch.getByRole('button', { name: 'Receive what came back…' }).click()
    await batch.getByRole('button', { name: 'Review the receipt' }).click()
    await batch.getByRole('button', { name: 'Receive 1 cutter' }).click()
    await page.getByRole('status').filter({ hasText: `Batch ${batchNumber}: 1 back in the crib.` }).waitFor()
    expect((await cutterState(out[1]!.id)).cutter.status).toBe('in_crib')
    const db = appDb()
    try {
      const row = await db.selectFrom('regrind_batches').select('status').where('id', '=', batchId).where('shop_id', '=', shop.id).executeTakeFirstOrThrow()
      expect(row.status).toBe('received')
    } finally {
      await db.destroy()
    }
    await check('regrind-all-back')

    await atPhoneWidth(journey, [
      { name: 'orders', path: '/crib/orders', heading: 'Orders' },
      { name: 'new-order', path: '/crib/orders/new', heading: 'New purchase order' },
      { name: 'reorder', path: '/crib/reorder', heading: 'Reorder' },
    ])
  })
})
