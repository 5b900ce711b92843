// An owner in the United States reads a shop whose clock is Chicago's, on a laptop set to
// Tokyo time: every date on the page is in US English order and on the shop's clock, the same
// words in the server's render as after the browser takes over (no hydration mismatch), and the
// insights say whose days they count. The expected clock time comes from the IANA tz database
// through the test runner's own Intl, not from Kerfbook's code.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { atPhoneWidth, DESKTOP, hydrated, signIn, startJourney, JOURNEY_TIMEOUT, type Journey } from '../support/browser'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'
import { addSpindleFixture, loadCutters, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let fx: SpindleFixture
let cutAt: Date
let journey: Journey

/** The text of every <time> element in a piece of HTML, as the server rendered it. */
function timesIn(html: string): string[] {
  return [...html.matchAll(/<time\b[^>]*>([^<]*)<\/time>/g)].map((m) => m[1]!.replace(/&nbsp;/g, '\u00a0').trim())
}

beforeAll(async () => {
  shop = await makeShop('Dates journey')
  expect((await shop.owner.patch('/api/shop', { timeZone: 'America/Chicago' })).status).toBe(200)
  fx = await addSpindleFixture(shop.id, 1)
  await loadCutters(shop.operator, [fx.cutters[0]!.id], fx.machines.changer)
  const materials = (await shop.operator.get('/api/materials')).body as Array<{ id: number }>
  cutAt = new Date(Date.now() - 60_000)
  const cut = await shop.operator.post(`/api/cutters/${fx.cutters[0]!.id}/cuts`, {
    idempotencyKey: `dates-${randomUUID()}`, materialId: materials[0]!.id, minutes: 12, outcome: 'clean', cutAt: cutAt.toISOString(),
  })
  expect(cut.status).toBe(201)
  journey = await startJourney('dates', DESKTOP, { locale: 'en-US', timezoneId: 'Asia/Tokyo' })
})
afterAll(() => journey?.close())

describe("dates in the reader's words, on the shop's clock", () => {
  it('the server and the browser render the same dates, in en-US order and Chicago time', async () => {
    const { page, check } = journey
    await signIn(page, shop.emails.owner, TEST_PASSWORD)
    const code = fx.cutters[0]!.code

    // The crib's history of the cutter (headed by its code) and the cutter page (by its type).
    for (const [path, heading] of [[`/crib/cutters/${fx.cutters[0]!.id}`, code], [`/c/${code}`, 'Two-flute upcut 1/4"']] as const) {
      const answer = await page.goto(path)
      const served = timesIn(await answer!.text())
      await hydrated(page)
      await page.getByRole('heading', { level: 1, name: heading }).waitFor()
      expect(served.length, `${path} shows dates`).toBeGreaterThan(0)
      expect(await page.locator('time').allTextContents(), `${path}: the browser keeps the server's words`).toEqual(served)
      await check(path.startsWith('/c/') ? 'cutter-page' : 'cutter-history')
    }

    // The cut's clock time in Chicago, worded by the runner's Intl from the IANA tz database;
    // Tokyo's (the laptop's zone) is 15 hours on and never reads the same.
    const hourMinute = (timeZone: string) => new Intl.DateTimeFormat('en-US', { timeZone, hour: 'numeric', minute: '2-digit' }).format(cutAt)
    const shown = (await page.locator('time').allTextContents()).join(' | ')
    expect(shown).toContain(hourMinute('America/Chicago'))
    expect(shown).not.toContain(hourMinute('Asia/Tokyo'))
    // US English puts the month first: "Thu, Dec 3, 9:05 AM".
    expect(shown).toMatch(/\b(Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) \d{1,2}\b/)
  }, JOURNEY_TIMEOUT)

  it("the insights say their days are the shop's days in its zone", async () => {
    const { page, check } = journey
    await page.goto('/insights')
    await hydrated(page)
    await page.getByText("Days are the shop's days in America/Chicago, midnight to midnight, both ends included.").waitFor()
    await check('insights')
    await atPhoneWidth(journey, [
      { name: 'cutter-history', path: `/crib/cutters/${fx.cutters[0]!.id}`, heading: fx.cutters[0]!.code },
      { name: 'insights', path: '/insights', heading: 'Insights' },
      { name: 'reports', path: '/reports', heading: 'Tooling reports' },
    ])
  }, JOURNEY_TIMEOUT)
})
