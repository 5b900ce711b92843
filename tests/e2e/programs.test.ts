// An operator runs a job from an NC program on a phone: uploads the program, checks it against a
// machine whose pockets hold a dull bit and a downcut bit in acrylic, sees both warnings and the
// cautions, logs the run with the cleanup a melted edge cost, and the cutters' minutes grow by the
// estimates shown.
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { newLabelCode } from '../../shared/kerf/label-code'
import { appDb } from '../support/db'
import { PHONE, signIn, open, startJourney, JOURNEY_TIMEOUT, type Journey } from '../support/browser'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'

const PROGRAM = fileURLToPath(new URL('../fixtures/nc/metric-xy.ngc', import.meta.url))

let shop: TestShop
let journey: Journey
let dull: { id: number, code: string }
let downcut: { id: number, code: string }

beforeAll(async () => {
  shop = await makeShop('Program journey')
  const db = appDb()
  try {
    const machine = await db.insertInto('machines').values({ shop_id: shop.id, name: 'Changer router', min_rpm: 6000, max_rpm: 24000, pockets: 8 })
      .returning('id').executeTakeFirstOrThrow()
    const type = (name: string, helix: 'upcut' | 'downcut', flutes: number) => db.insertInto('cutter_types').values({
      shop_id: shop.id, name, profile: 'square_end', helix, flutes, cutting_diameter_mm: 6.35, shank_diameter_mm: 6.35,
      cutting_length_mm: 22, overall_length_mm: 64, rated_life_minutes: 600, min_usable_diameter_mm: 6, unit_cost_cents: 3000,
    }).returning('id').executeTakeFirstOrThrow()
    const upcut = await type('O-flute upcut 1/4"', 'upcut', 1)
    const down = await type('Two-flute downcut 1/4"', 'downcut', 2)
    // T1 (pocket 1): an O-flute past the resharpen mark; T2 (pocket 2): a downcut.
    ;[dull, downcut] = await db.insertInto('cutters').values([
      { shop_id: shop.id, type_id: upcut.id, code: newLabelCode(), diameter_mm: 6.35, status: 'in_spindle', machine_id: machine.id, pocket: 1, life_used: 0.93, minutes_this_life: 620, minutes_total: 620 },
      { shop_id: shop.id, type_id: down.id, code: newLabelCode(), diameter_mm: 6.35, status: 'in_spindle', machine_id: machine.id, pocket: 2 },
    ]).returning(['id', 'code']).execute() as [{ id: number, code: string }, { id: number, code: string }]
  } finally {
    await db.destroy()
  }
  journey = await startJourney('programs', PHONE)
})
afterAll(() => journey?.close())

const minutesOf = async (ids: number[]) => {
  const db = appDb()
  try {
    return new Map((await db.selectFrom('cutters').select(['id', 'minutes_total']).where('id', 'in', ids).execute()).map((c) => [c.id, c.minutes_total]))
  } finally {
    await db.destroy()
  }
}

const cutLogsOf = async (ids: number[]) => {
  const db = appDb()
  try {
    return (await db.selectFrom('cut_logs').select(['cutter_id', 'outcome', 'cleanup_minutes_per_part']).where('cutter_id', 'in', ids).orderBy('id').execute())
      .map((l) => [l.cutter_id, l.outcome, l.cleanup_minutes_per_part])
  } finally {
    await db.destroy()
  }
}

describe('a job from an NC program, on a phone', { timeout: JOURNEY_TIMEOUT }, () => {
  it('uploads, checks with both warnings, logs the run, and the minutes grow by the estimates', async () => {
    const { page, check } = journey
    await signIn(page, shop.emails.operator, TEST_PASSWORD)
    await open(page, '/programs')
    await page.getByRole('heading', { level: 1, name: 'NC programs' }).waitFor()
    await check('programs-empty')

    await page.locator('input[type=file]').setInputFiles({ name: 'acrylic-letters.ngc', mimeType: 'text/plain', buffer: readFileSync(PROGRAM) })
    await page.getByRole('button', { name: 'Upload and read' }).click()
    await page.getByRole('heading', { level: 1, name: 'acrylic-letters.ngc' }).waitFor()
    await page.getByRole('rowheader', { name: 'T2' }).waitFor()
    await check('program-read')

    await page.getByLabel('Machine').selectOption({ label: 'Changer router' })
    await page.getByLabel('Material').selectOption({ label: 'Cast acrylic' })
    await page.getByRole('button', { name: 'More: Sheets or repeats' }).click()
    await page.getByRole('button', { name: 'Check the pockets' }).click()
    const t1 = page.getByRole('article', { name: 'T1' })
    const t2 = page.getByRole('article', { name: 'T2' })
    await t1.getByRole('link', { name: dull.code }).waitFor()
    await expect(t1.locator('[data-warning=due]').textContent()).resolves.toMatch(new RegExp(`${dull.code} is due for resharpening`))
    await expect(t2.locator('[data-warning=downcut_in_plastic]').textContent()).resolves.toMatch(new RegExp(`${downcut.code} is a downcut bit: in Cast acrylic it packs chips into the cut`))
    await page.getByText('Never leave a cut of plastic or MDF unattended: hot chips can ignite.').waitFor()
    await page.getByText('the bit maker\'s data, the machine\'s manual and local codes govern', { exact: false }).waitFor()
    const needed = await Promise.all([t1, t2].map(async (t) => Number((await t.getByText(/min needed$/).textContent())!.replace(' min needed', ''))))
    await check('checked')

    const before = await minutesOf([dull.id, downcut.id])
    await page.getByLabel('Job reference (the customer\'s order or job number)').fill('Order 4471')
    // T2's downcut melted the acrylic: its outcome, then the cleanup it cost, asked only for a poor finish.
    await page.getByText('Change a tool\'s minutes, outcome or cleanup').click()
    const cleanup = page.getByLabel('Cleanup minutes per part (optional)')
    await expect(cleanup.count()).resolves.toBe(0)
    await page.locator('select[name=outcome-T2]').selectOption('melted')
    await cleanup.fill('700')
    await page.getByRole('button', { name: 'Ran 2 sheets: log every tool' }).click()
    await page.getByText('Cleanup is minutes per part, 0 to 600, or leave it empty.').waitFor()
    await check('run-cleanup-refused')
    await cleanup.fill('6,5')
    await page.getByRole('button', { name: 'Ran 2 sheets: log every tool' }).click()
    await page.getByRole('status').getByText('Logged the run.').waitFor()
    await check('logged')
    const logs = await cutLogsOf([dull.id, downcut.id])
    expect(logs).toEqual([[dull.id, 'clean', null], [downcut.id, 'melted', 6.5]])
    const after = await minutesOf([dull.id, downcut.id])
    // The page shows the minutes needed to 0.1; the logs hold the estimate × 2 to 0.01.
    expect(Math.abs(after.get(dull.id)! - before.get(dull.id)! - needed[0]!)).toBeLessThanOrEqual(0.06)
    expect(Math.abs(after.get(downcut.id)! - before.get(downcut.id)! - needed[1]!)).toBeLessThanOrEqual(0.06)
    expect(after.get(dull.id)! - before.get(dull.id)!).toBeGreaterThan(0)
  })
})
