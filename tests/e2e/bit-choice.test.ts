// "Which bit?" on a phone (390 px, touch): the operator opens the panel on the home page, asks for
// a cut-out in HDPE and reads the shop's types ranked, the poor fit last with why; then picks HDPE
// on the cut form of a loaded downcut and sees the one-line warning naming the better type in the
// crib. Every step is screenshotted and checked with axe-core (WCAG 2.x A and AA).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { newLabelCode } from '../../shared/kerf/label-code'
import { appDb } from '../support/db'
import { PHONE, JOURNEY_TIMEOUT, open, signIn, startJourney, type Journey } from '../support/browser'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let fx: SpindleFixture
let downcutCode: string
let journey: Journey

beforeAll(async () => {
  shop = await makeShop('Bit journey')
  fx = await addSpindleFixture(shop.id, 2, 600)
  const db = appDb()
  try {
    const base = { shop_id: shop.id, shank_diameter_mm: 6.35, cutting_length_mm: 22, overall_length_mm: 64, rated_life_minutes: 900, min_usable_diameter_mm: 6, unit_cost_cents: 4000 }
    const [oflute, downcut] = await db.insertInto('cutter_types').values([
      { ...base, name: 'O-flute upcut 1/4"', profile: 'o_flute', helix: 'upcut', flutes: 1, cutting_diameter_mm: 6.35 },
      { ...base, name: 'Two-flute downcut 1/4"', profile: 'square_end', helix: 'downcut', flutes: 2, cutting_diameter_mm: 6.35 },
    ]).returning('id').execute()
    downcutCode = newLabelCode()
    await db.insertInto('cutters').values([
      { shop_id: shop.id, type_id: oflute!.id, code: newLabelCode(), diameter_mm: 6.35 },
      { shop_id: shop.id, type_id: oflute!.id, code: newLabelCode(), diameter_mm: 6.35, life_used: 0.4 },
      { shop_id: shop.id, type_id: downcut!.id, code: downcutCode, diameter_mm: 6.35, status: 'in_spindle', machine_id: fx.machines.changer },
    ]).execute()
  } finally {
    await db.destroy()
  }
  journey = await startJourney('bit-choice', PHONE)
})
afterAll(() => journey?.close())

describe('which bit, on a phone', { timeout: JOURNEY_TIMEOUT }, () => {
  it('ranks the shop\'s types for a job from the home page, and warns on the cut form of a poorly fitting bit', async () => {
    const { page, check } = journey
    await signIn(page, shop.emails.operator, TEST_PASSWORD)

    await page.getByRole('button', { name: 'Which bit?' }).click()
    const form = page.getByRole('form', { name: 'Which bit for the job?' })
    await form.waitFor()
    await check('panel-open')

    // Asking without a material, and with a thickness out of range, says what to fix.
    await form.getByLabel('Thickness (mm, optional)').fill('400')
    await form.getByRole('button', { name: 'Show the bits' }).click()
    await form.getByText('Choose the material.').waitFor()
    await form.getByText('at most 300 mm').waitFor()
    await check('panel-errors')

    await form.getByRole('button', { name: 'HDPE', exact: true }).click()
    await form.getByRole('button', { name: 'Profile / cut-out' }).click()
    await form.getByLabel('Thickness (mm, optional)').fill('12')
    await form.getByLabel('Machine (optional)').selectOption({ label: 'Big table with changer' })
    await form.getByRole('button', { name: 'Show the bits' }).click()

    const results = page.getByRole('region', { name: /^Bits for Profile \/ cut-out in HDPE, 12 mm/ })
    await results.waitFor()
    const best = results.getByRole('list').first().getByRole('article')
    await expect(best.first().getAttribute('aria-label')).resolves.toBe('O-flute upcut 1/4": Good fit')
    await expect(best.first().innerText()).resolves.toMatch(/HDPE melts at 137 °C/)
    await expect(best.first().innerText()).resolves.toMatch(/2 sharp in the crib/)
    await expect(best.first().innerText()).resolves.toMatch(/Start at [\d,]+ rpm/)
    const poor = results.getByRole('heading', { name: 'Poor fits, and why' })
    await poor.waitFor()
    await expect(results.getByRole('article', { name: 'Two-flute downcut 1/4": Poor fit' }).innerText()).resolves.toMatch(/weld/)
    // Nothing wider than the phone.
    await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(PHONE.viewport.width)
    await check('panel-ranked')

    // The loaded downcut: picking HDPE on its cut form warns in one line and names the O-flute.
    await open(page, `/c/${downcutCode}`)
    await page.getByRole('button', { name: 'Log a cut' }).click()
    const cutForm = page.getByRole('form', { name: 'Log a cut' })
    await cutForm.getByRole('button', { name: 'HDPE', exact: true }).click()
    const warning = cutForm.getByRole('status').filter({ hasText: 'Poor fit for this material.' })
    await warning.waitFor()
    await expect(warning.innerText()).resolves.toMatch(/Better in the crib: O-flute upcut 1\/4" \(2 sharp\)/)
    await cutForm.getByRole('button', { name: /^Fuzzy/ }).click()
    await cutForm.getByLabel('Cleanup minutes per part (optional)').fill('4.5')
    await check('cut-form-warning')
    await cutForm.getByRole('button', { name: '10 minutes' }).click()
    await cutForm.getByRole('button', { name: 'Log 10 min' }).click()
    await page.getByRole('status').filter({ hasText: /Logged 10 min in HDPE/ }).waitFor()

    const db = appDb()
    try {
      const log = await db.selectFrom('cut_logs as l').innerJoin('cutters as c', 'c.id', 'l.cutter_id')
        .select(['l.outcome', 'l.cleanup_minutes_per_part']).where('c.code', '=', downcutCode).executeTakeFirstOrThrow()
      expect(log).toEqual({ outcome: 'fuzzy', cleanup_minutes_per_part: 4.5 })
    } finally {
      await db.destroy()
    }
  })
})
