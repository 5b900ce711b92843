// Leaving a page for another document (the next label scanned) does not wait for the page being left
// (utils/leave-quickly.ts): no pagehide listener of the app's code runs, and the scroll position that
// vue-router's listener used to save on the way out is already in the history entry, so Back after
// a full load still lands where the person was.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PHONE, open, signIn, startJourney, JOURNEY_TIMEOUT, type Journey } from '../support/browser'
import { baseUrl } from '../support/http'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let fx: SpindleFixture
let journey: Journey

beforeAll(async () => {
  shop = await makeShop('Leave')
  fx = await addSpindleFixture(shop.id, 2)
  journey = await startJourney('leave-quickly', PHONE)
})
afterAll(() => journey?.close())

describe('leaving a cutter page for the next label', { timeout: JOURNEY_TIMEOUT }, () => {
  it('runs no pagehide handler of the page left, and keeps its scroll position for Back', async () => {
    const phone = await journey.browser.newContext({ ...PHONE, baseURL: baseUrl(), locale: 'en-GB', timezoneId: 'UTC' })
    phone.setDefaultTimeout(30_000)
    try {
      const page = await phone.newPage()
      await signIn(page, shop.emails.owner, TEST_PASSWORD)
      const [first, second] = fx.cutters
      await open(page, `/c/${first!.code}`)

      // Halfway down the page; the position is kept once scrolling settles.
      const target = await page.evaluate(() => Math.floor((document.documentElement.scrollHeight - window.innerHeight) / 2))
      expect(target, 'the cutter page is taller than the phone').toBeGreaterThan(50)
      await page.evaluate((y) => window.scrollTo(0, y), target)
      await page.waitForFunction((y) => (history.state as { scroll?: { top: number } } | null)?.scroll?.top === y, target)
      // vue-router's own entries stay beside it.
      expect(await page.evaluate(() => (history.state as { current?: string }).current)).toBe(`/c/${first!.code}`)

      // A listener added by the page's code, as vue-router's is, would leave a mark on its way out.
      await page.evaluate(() => window.addEventListener('pagehide', () => localStorage.setItem('left-slowly', 'yes')))
      await open(page, `/c/${second!.code}`)
      expect(await page.evaluate(() => localStorage.getItem('left-slowly'))).toBeNull()

      // Back loads the page afresh (the test browser keeps no back-forward cache) at the same place.
      await page.goBack()
      await page.waitForURL((url) => url.pathname === `/c/${first!.code}`)
      await page.waitForFunction((y) => Math.abs(window.scrollY - y) <= 2, target)
    } finally {
      await phone.close()
    }
  })
})
