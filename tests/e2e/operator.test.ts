// An operator at the spindle, on a phone: signs in, opens a cutter from its label's address,
// loads it into a machine, logs a cut and returns it to the crib.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import path from 'node:path'
import { audit, PHONE, signIn, open, startJourney, JOURNEY_TIMEOUT, type Journey } from '../support/browser'
import { baseUrl } from '../support/http'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'

let shop: TestShop
let fx: SpindleFixture
let journey: Journey

beforeAll(async () => {
  shop = await makeShop('Spindle journey')
  fx = await addSpindleFixture(shop.id, 2, 600)
  journey = await startJourney('operator', PHONE)
})
afterAll(() => journey?.close())

describe('the operator on a phone', { timeout: JOURNEY_TIMEOUT }, () => {
  it('loads a cutter, logs a cut and returns it, and each step shows on the page', async () => {
    const { page, check } = journey
    const cutter = fx.cutters[0]!

    await open(page, '/login')
    await check('sign-in')
    await signIn(page, shop.emails.operator, TEST_PASSWORD)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scan' }).waitFor()
    await check('home')

    await open(page, `/c/${cutter.code}`)
    await page.getByRole('heading', { level: 1, name: 'Two-flute upcut 1/4"' }).waitFor()
    await expect(page.getByText('In the crib', { exact: true }).first().isVisible()).resolves.toBe(true)
    await check('cutter-in-crib')

    await page.getByRole('button', { name: 'Load into a machine' }).click()
    await page.getByRole('heading', { name: `Load ${cutter.code} into…` }).waitFor()
    await check('load-picker')
    await page.getByRole('button', { name: 'Big table with changer' }).click()
    // A tool changer: the phone asks for the pocket, free ones as big targets.
    await page.getByText('Which pocket of Big table with changer?').waitFor()
    await check('pocket-picker')
    await page.getByRole('button', { name: 'Pocket 3 free' }).click()
    const status = page.getByRole('status').filter({ hasText: 'Loaded into Big table with changer.' })
    await status.waitFor()
    await page.getByText('In Big table with changer', { exact: true }).waitFor()
    await check('loaded')

    await page.getByRole('button', { name: 'Log a cut' }).click()
    const form = page.getByRole('form', { name: 'Log a cut' })
    await form.waitFor()
    await expect(form.getByText('On Big table with changer').isVisible()).resolves.toBe(true)
    await form.getByRole('button', { name: '30 minutes' }).click()
    await form.getByRole('button', { name: 'MDF', exact: true }).click()
    await form.getByRole('button', { name: /^Clean/ }).click()
    await check('cut-form')
    await form.getByRole('button', { name: 'Log 30 min' }).click()
    await page.getByRole('status').filter({ hasText: 'Logged 30 min in MDF (clean).' }).waitFor()
    const lastCuts = page.getByRole('region', { name: 'Last cuts' })
    await expect(lastCuts.getByRole('listitem').count()).resolves.toBe(1)
    await expect(lastCuts.getByRole('listitem').first().innerText()).resolves.toMatch(/30 min\s+MDF\s+Clean/)
    await check('cut-logged')

    await page.getByRole('button', { name: 'Return to the crib' }).click()
    await page.getByRole('status').filter({ hasText: 'Returned to the crib.' }).waitFor()
    await page.getByRole('button', { name: 'Load into a machine' }).waitFor()
    await check('returned')

    const db = appDb()
    try {
      const row = await db.selectFrom('cutters').select(['status', 'machine_id', 'minutes_total', 'life_used']).where('id', '=', cutter.id).executeTakeFirstOrThrow()
      // 30 minutes of MDF (wear factor 1) on a 600-minute type is 5 % of its first life.
      expect(row).toMatchObject({ status: 'in_crib', machine_id: null, minutes_total: 30 })
      expect(row.life_used).toBeCloseTo(0.05, 9)
      const logs = await db.selectFrom('cut_logs').select(['minutes', 'outcome', 'machine_id', 'operator_id']).where('cutter_id', '=', cutter.id).execute()
      expect(logs).toEqual([{ minutes: 30, outcome: 'clean', machine_id: fx.machines.changer, operator_id: shop.ids.operator }])
      const events = await db.selectFrom('cutter_events').select('kind').where('cutter_id', '=', cutter.id).orderBy('id').execute()
      expect(events.map((e) => e.kind)).toEqual(['loaded', 'cut_logged', 'returned'])
    } finally {
      await db.destroy()
    }
  })

  it('a cut logged with no signal waits on the phone, signing out warns of it, and it arrives once when the signal is back', async () => {
    // A context of its own: the failed requests while offline are expected here, not page errors.
    const phone = await journey.browser.newContext({ ...PHONE, baseURL: baseUrl(), locale: 'en-GB', timezoneId: 'UTC', storageState: await journey.context.storageState() })
    phone.setDefaultTimeout(20_000)
    const cutter = fx.cutters[1]!
    const db = appDb()
    try {
      const page = await phone.newPage()
      await open(page, `/c/${cutter.code}`)
      await page.getByRole('button', { name: 'Load into a machine' }).click()
      await page.getByRole('button', { name: 'Big table with changer' }).click()
      await page.getByRole('button', { name: 'Pocket 1 free' }).click()
      await page.getByText('In Big table with changer', { exact: true }).waitFor()

      await phone.setOffline(true)
      await page.getByRole('button', { name: 'Log a cut' }).click()
      const form = page.getByRole('form', { name: 'Log a cut' })
      await form.getByRole('button', { name: '15 minutes' }).click()
      await form.getByRole('button', { name: 'MDF', exact: true }).click()
      await form.getByRole('button', { name: /^Clean/ }).click()
      await form.getByRole('button', { name: 'Log 15 min' }).click()
      await page.getByText(/Saved 15 min in MDF on this phone/).waitFor()
      await page.screenshot({ path: path.join(journey.folder, 'offline-cut-waiting.png'), fullPage: true })
      await expect(audit(page)).resolves.toEqual([])

      let warning = ''
      page.once('dialog', async (dialog) => { warning = dialog.message(); await dialog.dismiss() })
      await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).click()
      await expect.poll(() => warning).toMatch(/^1 cut log has not reached the server yet\. It stays on this device/)
      // Dismissed: still signed in, on the same page, and nothing reached the server.
      expect(new URL(page.url()).pathname).toBe(`/c/${cutter.code}`)
      const logs = () => db.selectFrom('cut_logs').select(['minutes']).where('cutter_id', '=', cutter.id).execute()
      await expect(logs()).resolves.toEqual([])

      await phone.setOffline(false)
      await expect.poll(logs, { timeout: 20_000 }).toEqual([{ minutes: 15 }])
      // With nothing left waiting, signing out asks nothing.
      page.once('dialog', (dialog) => { warning = `unexpected: ${dialog.message()}`; void dialog.dismiss() })
      await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).click()
      await page.waitForURL((url) => url.pathname === '/login')
      expect(warning).not.toMatch(/^unexpected/)
      await expect(logs()).resolves.toEqual([{ minutes: 15 }])
    } finally {
      await db.destroy()
      await phone.close()
    }
  })

  it('with no signal from the first, a scanned label still opens from the phone\'s copy, and a cut and a load made there reach the server once each', async () => {
    // A shop of its own: one bit already in a machine, one on the shelf.
    const away = await makeShop('Offline first visit')
    const afx = await addSpindleFixture(away.id, 2, 600)
    const [inMachine, onShelf] = afx.cutters as [{ id: number, code: string }, { id: number, code: string }]
    expect((await away.operator.post(`/api/cutters/${inMachine.id}/load`, { machineId: afx.machines.changer })).status).toBe(200)

    const phone = await journey.browser.newContext({ ...PHONE, baseURL: baseUrl(), locale: 'en-GB', timezoneId: 'UTC' })
    phone.setDefaultTimeout(20_000)
    const shot = (page: import('playwright-core').Page, name: string) => page.screenshot({ path: path.join(journey.folder, `${name}.png`), fullPage: true })
    const db = appDb()
    try {
      const page = await phone.newPage()
      await signIn(page, away.emails.operator, TEST_PASSWORD)
      // Home, once: the app and the shop's copy are kept on the phone from here.
      await page.evaluate(() => navigator.serviceWorker.ready)
      await page.waitForFunction(() => Boolean(localStorage.getItem('kerfbook.offline-copy.v1')))

      await phone.setOffline(true)
      // The label is scanned: its address is opened, never visited before, with no connection.
      await page.goto(`/c/${inMachine.code}`)
      await page.getByText(/No connection: shown from the copy on this phone, taken (this minute|\d+ minutes? ago)\./).waitFor()
      await page.getByRole('heading', { level: 1, name: 'Two-flute upcut 1/4"' }).waitFor()
      await page.getByText('In Big table with changer', { exact: true }).waitFor()
      await shot(page, 'offline-first-visit')
      await expect(audit(page)).resolves.toEqual([])

      await page.getByRole('button', { name: 'Log a cut' }).click()
      const form = page.getByRole('form', { name: 'Log a cut' })
      await form.getByRole('button', { name: '45 minutes' }).click()
      await form.getByRole('button', { name: 'MDF', exact: true }).click()
      await form.getByRole('button', { name: /^Clean/ }).click()
      await form.getByRole('button', { name: 'Log 45 min' }).click()
      await page.getByText(/Saved 45 min in MDF on this phone/).waitFor()

      // Another bit, another label: loaded into the other big table, still with no connection.
      await page.goto(`/c/${onShelf.code}`)
      await page.getByText('In the crib', { exact: true }).first().waitFor()
      await page.getByRole('button', { name: 'Load into a machine' }).click()
      await page.getByRole('button', { name: 'Second big table' }).click()
      // It has a tool changer: the phone's copy knows its pockets too.
      await page.getByRole('button', { name: /^Pocket \d+ free$/ }).first().click()
      await page.getByRole('status').filter({ hasText: `Saved on this phone: ${onShelf.code} is loaded into Second big table once the connection is back.` }).waitFor()
      await page.getByText('In Second big table', { exact: true }).waitFor()
      await shot(page, 'offline-load-waiting')

      const nothingYet = await db.selectFrom('cut_logs').select('id').where('shop_id', '=', away.id).execute()
      expect(nothingYet).toEqual([])

      await phone.setOffline(false)
      const sent = async () => {
        const logs = await db.selectFrom('cut_logs').select(['cutter_id', 'minutes']).where('shop_id', '=', away.id).execute()
        const loads = await db.selectFrom('cutter_events').select(['cutter_id', 'machine_id']).where('shop_id', '=', away.id).where('kind', '=', 'loaded').where('cutter_id', '=', onShelf.id).execute()
        return { logs, loads }
      }
      await expect.poll(sent, { timeout: 30_000 }).toEqual({ logs: [{ cutter_id: inMachine.id, minutes: 45 }], loads: [{ cutter_id: onShelf.id, machine_id: afx.machines.other }] })
      const rows = await db.selectFrom('cutters').select(['id', 'status', 'machine_id', 'minutes_total', 'life_used']).where('shop_id', '=', away.id).orderBy('id').execute()
      // 45 minutes of MDF (wear factor 1) on a 600-minute type: 7.5 % of the first life (Miner's rule).
      expect(rows[0]).toMatchObject({ status: 'in_spindle', machine_id: afx.machines.changer, minutes_total: 45 })
      expect(rows[0]!.life_used).toBeCloseTo(0.075, 9)
      expect(rows[1]).toMatchObject({ status: 'in_spindle', machine_id: afx.machines.other, minutes_total: 0 })
      // Back online, the page shows the server's own figures again.
      await page.getByText(/No connection: shown from the copy/).waitFor({ state: 'detached' })
      await shot(page, 'offline-sent')
    } finally {
      await db.destroy()
      await phone.close()
    }
  })

  it('the accessibility check itself reports what a person would trip over', async () => {
    // A page with an unlabelled image and grey-on-grey text: both serious under WCAG 2 AA
    // (1.1.1 non-text content, 1.4.3 contrast), so the journeys' check must name them.
    const page = await journey.context.newPage()
    try {
      await page.setContent('<html lang="en"><title>t</title><main><img src="data:image/gif;base64,R0lGODlhAQABAAAAACw="><p style="color:#bbb;background:#ccc">faint</p></main></html>')
      const found = await audit(page)
      expect(found.map((line) => line.split(':')[0]).sort()).toEqual(['critical image-alt', 'serious color-contrast'].sort())
      expect(found.find((line) => line.includes('color-contrast'))).toContain('-> p')
    } finally {
      await page.close()
    }
  })
})
