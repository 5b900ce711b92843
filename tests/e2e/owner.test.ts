// The owner at a desk: invites a crib manager (who takes up the invitation on a phone) and reads
// what the shop's cutting has cost.
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import { atPhoneWidth, DESKTOP, PHONE, hydrated, signIn, startJourney, JOURNEY_TIMEOUT, type Journey } from '../support/browser'
import { addSteadyUse } from '../support/demand'
import { waitForMail } from '../support/http'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'
import { addSpindleFixture } from '../support/spindle'

let shop: TestShop
let journey: Journey

beforeAll(async () => {
  shop = await makeShop('Owner journey')
  const fx = await addSpindleFixture(shop.id, 2, 600)
  // An hour of MDF (wear factor 1) a day for ten days on a $30.00 bit rated for 600 minutes, with
  // the two regrinds a type allows by default (no regrind cost set, each giving 0.8 of a life):
  // $30.00 / 2.6 lives = $11.54 a life, and the ten hours use one life, $1.15 per cut-hour.
  await addSteadyUse({
    shopId: shop.id, cutterId: fx.cutters[0]!.id, material: 'MDF', days: 10, minutesPerDay: 60, ratedLifeMinutes: 600,
    machineId: fx.machines.changer, operatorId: shop.ids.operator,
  })
  journey = await startJourney('owner', DESKTOP)
})
afterAll(() => journey?.close())

describe('the owner at a desk', { timeout: JOURNEY_TIMEOUT }, () => {
  it('invites a crib manager, who joins from the e-mail, and reads the insights', async () => {
    const { page, check, browser } = journey
    await signIn(page, shop.emails.owner, TEST_PASSWORD)
    // Every item of the owner's bar stays on one line, "Sign out" included, the parts of the bar
    // sit side by side without overlapping, and nothing spills past the window: at 1280 px and at
    // 1024 px, the narrowest width with the full bar.
    for (const width of [1024, 1280]) {
      await page.setViewportSize({ width, height: 800 })
      await expect(barProblems(page), `the top bar at ${width} px`).resolves.toEqual([])
    }
    await page.getByRole('banner').getByRole('link', { name: 'Account: Test Owner' }).waitFor()
    await check('home')

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Team' }).click()
    await page.getByRole('heading', { level: 1, name: 'Team' }).waitFor()
    await check('team')
    const invited = `robin-${shop.id}@example.com`
    const form = page.locator('form').filter({ has: page.getByRole('heading', { name: 'Invite someone' }) })
    await form.getByLabel('Name').fill('Robin Vale')
    await form.getByLabel('E-mail').fill(invited)
    await form.getByRole('radio', { name: 'Crib manager' }).check()
    await form.getByRole('button', { name: 'Send the invitation' }).click()
    await page.getByRole('status').filter({ hasText: `Invitation sent to ${invited}.` }).waitFor()
    const row = page.getByRole('list', { name: 'People in the shop' }).getByRole('listitem').filter({ hasText: 'Robin Vale' })
    await expect(row.innerText()).resolves.toContain(`${invited} · Invitation sent`)
    await expect(row.getByLabel('Role of Robin Vale').inputValue()).resolves.toBe('crib_manager')
    await check('invited')

    // The invitation arrives; its link works on the newcomer's own phone.
    const mail = await waitForMail(invited, 'invited')
    const link = mail.text.match(/https?:\/\/\S+\/invite\/[\w-]+/)?.[0]
    expect(link, mail.text).toBeTruthy()
    const phone = await browser.newContext({ ...PHONE, locale: 'en-GB', timezoneId: 'UTC' })
    try {
      const newcomer = await phone.newPage()
      await newcomer.goto(link!)
      await hydrated(newcomer)
      await newcomer.getByRole('heading', { level: 1, name: /^Join Owner journey shop/ }).waitFor()
      await check('invitation-link', newcomer)
      await newcomer.getByLabel('Password', { exact: true }).fill('robins-own-password')
      await newcomer.getByRole('button', { name: 'Save and sign in' }).click()
      await newcomer.waitForURL((url) => url.pathname === '/')
      await newcomer.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Crib' }).waitFor()
      await check('newcomer-home', newcomer)
    } finally {
      await phone.close()
    }
    const db = appDb()
    try {
      const user = await db.selectFrom('users').select(['shop_id', 'role', 'name', 'active']).where('email', '=', invited).executeTakeFirstOrThrow()
      expect(user).toEqual({ shop_id: shop.id, role: 'crib_manager', name: 'Robin Vale', active: true })
    } finally {
      await db.destroy()
    }

    // The insights: the ten hours of MDF and what they cost.
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Insights' }).click()
    const cost = page.getByRole('region', { name: 'Tooling cost per cut-hour' })
    const mdf = cost.getByRole('row').filter({ hasText: 'MDF' })
    await mdf.waitFor()
    await expect(mdf.getByRole('cell').allInnerTexts()).resolves.toEqual(['MDF', '10.0', '$11.54', '$1.15'])
    await page.getByRole('region', { name: 'Wear by material' }).waitFor()
    await check('insights')

    await atPhoneWidth(journey, [
      { name: 'team', path: '/team', heading: 'Team' },
      { name: 'insights', path: '/insights', heading: 'Insights' },
    ])
  })
})

/** What is wrong with the top bar as drawn: items whose label wraps, parts that overlap, overflow. */
function barProblems(page: Page): Promise<string[]> {
  return page.getByRole('banner').evaluate((bar) => {
    const problems: string[] = []
    for (const item of bar.querySelectorAll<HTMLElement>('nav a, button')) {
      // The distinct line boxes of the item's own text.
      const tops = new Set<number>()
      const walker = document.createTreeWalker(item, NodeFilter.SHOW_TEXT)
      for (let node = walker.nextNode(); node; node = walker.nextNode()) {
        if (!node.textContent?.trim()) continue
        const range = document.createRange()
        range.selectNodeContents(node)
        for (const r of range.getClientRects()) if (r.width > 0) tops.add(Math.round(r.top))
      }
      if (tops.size !== 1) problems.push(`"${item.innerText.trim()}" takes ${tops.size} lines`)
    }
    const parts = [...bar.firstElementChild!.children].map((el) => el.getBoundingClientRect()).filter((r) => r.width > 0)
    for (let i = 1; i < parts.length; i++) {
      if (parts[i]!.left < parts[i - 1]!.right - 0.5) problems.push(`part ${i + 1} of the bar overlaps part ${i}`)
    }
    if (parts.at(-1)!.right > window.innerWidth) problems.push('the bar runs past the window')
    return problems
  })
}
