// Every page speaks to a person, online and offline: no request line, no URL, no "Failed to fetch"
// or "<no response>" on any page, whatever failed; and a page that failed for lack of a
// connection loads by itself when the connection is back.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PHONE, open, signIn, startJourney, JOURNEY_TIMEOUT, type Journey } from '../support/browser'
import { baseUrl } from '../support/http'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

/** The platform's words that must never reach a person. */
const DEVELOPER_TEXT = [/Failed to fetch/i, /<no response>/i, /\[(GET|POST|PATCH|PUT|DELETE)\]/, /ERR_INTERNET_DISCONNECTED/]

let shop: TestShop
let fx: SpindleFixture
let journey: Journey

beforeAll(async () => {
  shop = await makeShop('Words')
  fx = await addSpindleFixture(shop.id, 1, 600)
  journey = await startJourney('words', PHONE)
})
afterAll(() => journey?.close())

function pages(): string[] {
  const c = fx.cutters[0]!
  return ['/', '/scan', '/account', '/feeds', '/insights', '/reports', '/settings', '/team', `/labels?ids=${c.id}`,
    '/crib', '/crib/catalogue', `/crib/catalogue/${fx.typeId}`, '/crib/catalogue/new', '/crib/chip-loads', `/crib/cutters/${c.id}`,
    '/crib/import', '/crib/orders', '/crib/orders/new', '/crib/regrind', '/crib/reorder', '/crib/suppliers', '/crib/machines',
    '/crib/materials', `/machines/${fx.machines.changer}`, '/programs', '/bit-choice', `/c/${c.code}`, '/c/ZZZZ999']
}

async function visibleText(page: import('playwright-core').Page): Promise<string> {
  await page.waitForLoadState('networkidle')
  return page.locator('body').innerText()
}

describe('the words on every page', { timeout: JOURNEY_TIMEOUT * 3 }, () => {
  it('hold no request line or platform error online, and none offline either', async () => {
    // A phone of its own: the failed requests while offline are expected here, not page errors.
    const phone = await journey.browser.newContext({ ...PHONE, baseURL: baseUrl(), locale: 'en-GB', timezoneId: 'UTC' })
    phone.setDefaultTimeout(30_000)
    try {
      const page = await phone.newPage()
      await signIn(page, shop.emails.owner, TEST_PASSWORD)
      // The app shell and the shop's copy are on the phone once a page has been opened signed in.
      await page.evaluate(() => navigator.serviceWorker.ready)
      await page.waitForFunction(() => Boolean(localStorage.getItem('kerfbook.offline-copy.v1')))

      for (const path of pages()) {
        await open(page, path)
        const text = await visibleText(page)
        for (const bad of DEVELOPER_TEXT) expect(text, `online ${path}`).not.toMatch(bad)
      }

      await phone.setOffline(true)
      for (const path of pages()) {
        // Opened afresh without a connection (the service worker's shell), and reached from the
        // page before by the app's own navigation: both ways fail their requests.
        await page.goto(path)
        await page.locator('#__nuxt').waitFor()
        const text = await visibleText(page)
        for (const bad of DEVELOPER_TEXT) expect(text, `offline ${path}`).not.toMatch(bad)
      }

      // Home without a connection says so, and loads by itself when the connection is back.
      await page.goto('/')
      const noConnection = page.getByText(/No connection to the server\. Cutter pages still open from the copy on this phone/)
      await noConnection.first().waitFor()
      await phone.setOffline(false)
      await noConnection.first().waitFor({ state: 'detached' })
      for (const bad of DEVELOPER_TEXT) expect(await visibleText(page)).not.toMatch(bad)
    } finally {
      await phone.close()
    }
  })
})
