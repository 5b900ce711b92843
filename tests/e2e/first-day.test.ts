// A new shop's first day, in the browser only (no database writes of its own, no demo seed): the
// owner signs up and confirms the address from the e-mail, adds two machines (one with an 8-pocket
// changer, one manual), a material, a supplier and a cutter type, receives three cutters and opens
// their label sheet, enrols the browser as the shop's device and adds an operator by name with a
// PIN. On the device the operator signs in with the PIN, opens a cutter by its label code, loads
// it, logs a cut and corrects its minutes; the cutter's totals and history follow. Getting ready
// on Home ticks along the way.
import type { Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { atPhoneWidth, DESKTOP, open, PHONE, signIn, startJourney, JOURNEY_TIMEOUT, type Journey } from '../support/browser'
import { baseUrl, waitForMail } from '../support/http'

const TAG = Math.random().toString(36).slice(2, 8)
const SHOP = `Ferncliff Routing ${TAG}`
const OWNER_EMAIL = `owner-${TAG}@example.com`
const OWNER_PASSWORD = 'first-day-owner-password'
const TYPE = 'Single-flute O-flute 1/4"'
const MATERIAL = 'Cast acrylic, frosted'
const OPERATOR = 'Dana Reyes'
const PIN = '4827'

let journey: Journey
beforeAll(async () => {
  journey = await startJourney('first-day', DESKTOP)
})
afterAll(() => journey?.close())

/** The keys of the Getting ready steps still open on Home. */
async function openSteps(page: Page): Promise<string[]> {
  await open(page, '/')
  await page.getByRole('heading', { level: 2, name: 'Getting ready' }).waitFor()
  return page.locator('[data-step]').evaluateAll((steps) => steps.filter((s) => s.textContent?.includes('(to do)')).map((s) => s.getAttribute('data-step')!))
}

describe('a new shop\'s first day', { timeout: JOURNEY_TIMEOUT * 3 }, () => {
  it('goes from sign-up to a corrected cut on a shared device, with nothing done by hand', async () => {
    const { page, check, browser } = journey

    // Sign up; the confirmation e-mail arrives and its link confirms the address.
    await open(page, '/signup')
    await check('signup')
    await page.getByLabel('Shop name').fill(SHOP)
    await page.getByLabel('Your name').fill('Maren Osei')
    await page.getByLabel('E-mail').fill(OWNER_EMAIL)
    await page.getByLabel('Password').fill(OWNER_PASSWORD)
    await page.getByRole('button', { name: 'Create the shop' }).click()
    await page.waitForURL((url) => url.pathname === '/')
    await page.getByRole('heading', { level: 2, name: 'Getting ready' }).waitFor()
    await check('home-new-shop')
    expect(await openSteps(page)).toEqual(['machine', 'materials', 'supplier', 'cutterType', 'stock', 'operator', 'firstCut'])

    const mail = await waitForMail(OWNER_EMAIL, 'Confirm your e-mail address')
    const link = mail.text.match(/https?:\/\/\S+\/confirm\/[\w-]+/)?.[0]
    expect(link, mail.text).toBeTruthy()
    await open(page, new URL(link!).pathname)
    await page.getByRole('button', { name: 'Confirm my address' }).click()
    await page.getByRole('status').filter({ hasText: `${OWNER_EMAIL} is confirmed` }).waitFor()
    await check('address-confirmed')

    // Two machines: a router with an 8-pocket changer and a manual one.
    await open(page, '/crib/machines')
    await page.getByText('No machines yet.').waitFor()
    await check('machines-empty')
    const machines: Array<{ name: string, pockets: number }> = [{ name: 'Big router', pockets: 8 }, { name: 'Bench router', pockets: 0 }]
    for (const m of machines) {
      await page.getByRole('button', { name: 'Add a machine' }).click()
      const form = page.getByRole('region', { name: 'Add a machine' })
      await form.getByLabel('Name').fill(m.name)
      await form.getByLabel('Lowest spindle speed (rpm)').fill('6000')
      await form.getByLabel('Highest spindle speed (rpm)').fill('24000')
      if (m.pockets) {
        await form.getByRole('radio', { name: 'Yes, with pockets' }).check()
        await form.getByRole('textbox', { name: 'Pockets' }).fill(String(m.pockets))
      } else {
        await form.getByRole('radio', { name: /^No: a manual collet/ }).check()
      }
      await form.getByRole('button', { name: 'Add this machine' }).click()
      await page.getByRole('status').filter({ hasText: `Added ${m.name}.` }).waitFor()
    }
    const machineList = page.getByRole('list', { name: 'Machines' })
    await expect(machineList.getByRole('listitem').filter({ hasText: 'Big router' }).innerText()).resolves.toContain('Tool changer, 8 pockets')
    await expect(machineList.getByRole('listitem').filter({ hasText: 'Bench router' }).innerText()).resolves.toContain('Manual collet, one bit')
    await check('machines')

    // A material the starting list lacks.
    await open(page, '/crib/materials')
    await page.getByRole('button', { name: 'Add a material' }).click()
    const materialForm = page.getByRole('region', { name: 'Add a material' })
    await materialForm.getByLabel('Name').fill(MATERIAL)
    await materialForm.getByLabel('Family').selectOption({ label: 'Hard plastic' })
    await materialForm.getByLabel('Wear factor').fill('1.5')
    await materialForm.getByRole('button', { name: 'Add this material' }).click()
    await page.getByRole('status').filter({ hasText: `Added ${MATERIAL}.` }).waitFor()
    await check('materials')

    // A supplier and a cutter type from it.
    await open(page, '/crib/suppliers')
    await page.getByRole('button', { name: 'Add a supplier' }).click()
    const supplierForm = page.getByRole('region', { name: 'Add a supplier' })
    await supplierForm.getByLabel('Name').fill('Kestrel Edge Tools')
    await supplierForm.getByLabel('Contact e-mail').fill(`sales-${TAG}@example.com`)
    await supplierForm.getByLabel('Lead time (days)').fill('6')
    await supplierForm.getByRole('button', { name: 'Add this supplier' }).click()
    await page.getByRole('status').filter({ hasText: 'Added Kestrel Edge Tools.' }).waitFor()
    await check('suppliers')
    expect(await openSteps(page)).toEqual(['cutterType', 'stock', 'operator', 'firstCut'])

    await open(page, '/crib/catalogue/new')
    await page.getByRole('heading', { level: 1, name: 'Add a cutter type' }).waitFor()
    await page.getByLabel('Name', { exact: true }).fill(TYPE)
    await page.getByLabel('Supplier', { exact: true }).selectOption({ label: 'Kestrel Edge Tools' })
    await page.getByRole('radio', { name: 'O-flute' }).check()
    await page.getByLabel('Flutes').fill('1')
    await page.getByLabel('Cutting diameter (mm)').fill('6.35')
    await page.getByLabel('Shank diameter (mm)').fill('6.35')
    await page.getByLabel('Cutting (flute) length (mm)').fill('22')
    await page.getByLabel('Overall length (mm)').fill('64')
    await page.getByLabel('Rated life (minutes)').fill('600')
    await page.getByLabel('Smallest usable diameter (mm)').fill('6')
    await page.getByLabel('Price of one cutter ($)').fill('38.50')
    await check('cutter-type-form')
    await page.getByRole('button', { name: 'Add this cutter type' }).click()
    await page.waitForURL((url) => url.pathname === '/crib/catalogue')
    await page.getByText(TYPE).first().waitFor()
    await check('catalogue')

    // Three cutters received without an order; their label sheet opens.
    await open(page, '/crib/orders')
    const delivery = page.locator('form').filter({ has: page.getByRole('heading', { name: 'Receive without an order' }) })
    await delivery.getByLabel('Cutter type').selectOption({ label: TYPE })
    await delivery.getByLabel('How many').fill('3')
    await check('receive')
    await delivery.getByRole('button', { name: 'Receive and print labels' }).click()
    await page.waitForURL((url) => url.pathname === '/labels')
    await page.getByRole('button', { name: 'Print 3 labels' }).waitFor()
    await expect(page.getByRole('img', { name: /^QR code for / }).count()).resolves.toBe(3)
    const codes = await page.locator('.cutter-label__code').allInnerTexts()
    expect(codes).toHaveLength(3)
    const code = codes[0]!.trim()
    const labelsPath = new URL(page.url()).pathname + new URL(page.url()).search
    await check('labels')
    expect(await openSteps(page)).toEqual(['operator', 'firstCut'])

    // This browser becomes the shop's device; an operator without e-mail is added with a PIN.
    await open(page, '/crib/devices')
    await page.getByRole('heading', { level: 1, name: 'Shop devices and PINs' }).waitFor()
    await check('devices-empty')
    await page.getByLabel('Name of this device').fill('Tablet by router 2')
    await page.getByRole('button', { name: 'Enrol this browser' }).click()
    await page.getByRole('status').filter({ hasText: 'This browser is now the shop device "Tablet by router 2".' }).waitFor()
    await page.getByText('This browser is the shop device').waitFor()
    const added = page.getByRole('form', { name: 'Add an operator without e-mail' })
    await added.getByLabel('Name', { exact: true }).fill(OPERATOR)
    await added.getByLabel('PIN (4 to 8 digits)').fill(PIN)
    await added.getByRole('button', { name: 'Add the operator' }).click()
    await expect(page.getByTestId('shown-pin').innerText()).resolves.toBe(PIN)
    await expect(page.getByRole('list', { name: 'Operators' }).getByRole('listitem').filter({ hasText: OPERATOR }).innerText()).resolves.toContain('No e-mail · Has a PIN')
    const devices = page.getByRole('list', { name: 'Enrolled devices' })
    await expect(devices.innerText()).resolves.toMatch(/Tablet by router 2 \(this browser\)[\s\S]*by Maren Osei · no PIN sign-in yet/)
    await check('devices')
    expect(await openSteps(page)).toEqual(['firstCut'])

    // The owner's pages at phone width too, while the owner is signed in.
    await atPhoneWidth(journey, [
      { name: 'machines', path: '/crib/machines', heading: 'Machines' },
      { name: 'materials', path: '/crib/materials', heading: 'Materials' },
      { name: 'suppliers', path: '/crib/suppliers', heading: 'Suppliers' },
      { name: 'cutter-type', path: '/crib/catalogue/new', heading: 'Add a cutter type' },
      { name: 'labels', path: labelsPath, heading: '3 cutters' },
      { name: 'devices', path: '/crib/devices', heading: 'Shop devices and PINs' },
    ])

    // The owner signs out; the device's sign-in page lists the operator by name.
    await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL((url) => url.pathname === '/login')
    await page.getByRole('heading', { level: 1, name: 'Who is signing in?' }).waitFor()
    await check('device-sign-in-desktop')

    // The same device (its cookies), held as a phone at the machine.
    const tablet = await browser.newContext({ ...PHONE, baseURL: baseUrl(), locale: 'en-GB', timezoneId: 'UTC', storageState: await journey.context.storageState() })
    tablet.setDefaultTimeout(20_000)
    try {
      const phone = await tablet.newPage()
      const pageErrors: string[] = []
      phone.on('pageerror', (err) => pageErrors.push(err.message))
      await open(phone, '/login')
      await phone.getByRole('heading', { level: 1, name: 'Who is signing in?' }).waitFor()
      await expect(phone.getByText(`${SHOP} · Tablet by router 2`).isVisible()).resolves.toBe(true)
      await check('device-sign-in', phone)

      // A wrong PIN first: said plainly, and the PIN is typed again.
      await phone.getByRole('list', { name: 'Operators' }).getByRole('button', { name: OPERATOR }).click()
      for (const digit of '1357') await phone.getByRole('group', { name: 'Keypad' }).getByRole('button', { name: digit, exact: true }).click()
      await phone.getByRole('button', { name: 'Sign in', exact: true }).click()
      await phone.getByRole('alert').filter({ hasText: 'Wrong PIN. Try again, or ask the crib manager for a new one.' }).waitFor()
      await expect(phone.getByLabel('PIN', { exact: true }).inputValue()).resolves.toBe('')
      await check('device-wrong-pin', phone)
      for (const digit of PIN) await phone.getByRole('group', { name: 'Keypad' }).getByRole('button', { name: digit, exact: true }).click()
      await phone.getByRole('button', { name: 'Sign in', exact: true }).click()
      await phone.waitForURL((url) => url.pathname === '/')
      await phone.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Scan' }).waitFor()
      await phone.getByRole('heading', { level: 1, name: 'Hello, Dana' }).waitFor()
      await check('operator-home', phone)
      // Signed in as the operator, who has no e-mail and no password to change.
      await open(phone, '/account')
      await phone.getByRole('heading', { level: 1, name: 'Account' }).waitFor()
      await phone.locator('#main').getByText(OPERATOR, { exact: true }).waitFor()
      await phone.getByText('You sign in with your PIN on the shop\'s devices.').waitFor()
      await expect(phone.getByRole('heading', { name: 'Change your password' }).count()).resolves.toBe(0)
      await check('operator-account', phone)

      // The cutter by its label code: loaded into the manual router, a cut logged, then corrected.
      await open(phone, `/c/${code}`)
      await phone.getByRole('heading', { level: 1, name: TYPE }).waitFor()
      await check('cutter', phone)
      await phone.getByRole('button', { name: 'Load into a machine' }).click()
      await phone.getByRole('button', { name: 'Bench router' }).click()
      await phone.getByRole('status').filter({ hasText: 'Loaded into Bench router.' }).waitFor()
      await phone.getByText('In Bench router', { exact: true }).waitFor()
      await check('loaded', phone)

      await phone.getByRole('button', { name: 'Log a cut' }).click()
      const cutForm = phone.getByRole('form', { name: 'Log a cut' })
      await cutForm.getByRole('button', { name: '30 minutes' }).click()
      await cutForm.getByRole('button', { name: MATERIAL, exact: true }).click()
      await cutForm.getByRole('button', { name: /^Clean/ }).click()
      await check('cut-form', phone)
      await cutForm.getByRole('button', { name: 'Log 30 min' }).click()
      await phone.getByRole('status').filter({ hasText: `Logged 30 min in ${MATERIAL} (clean).` }).waitFor()
      const cutInAll = phone.locator('dl div').filter({ hasText: 'cut in all' }).locator('dd')
      await expect(cutInAll.innerText()).resolves.toBe('30 min')
      // 30 minutes at wear factor 1.5 on a 600-minute type: 7.5 % of a life, shown in whole percent
      // rounded down (Palmgren-Miner linear damage, docs/domain.md computation 1).
      const lifeUsed = phone.getByRole('meter', { name: 'Life used' }).first()
      await expect(lifeUsed.getAttribute('aria-valuenow')).resolves.toBe('7')
      await check('cut-logged', phone)

      const lastCuts = phone.getByRole('region', { name: 'Last cuts' })
      await lastCuts.getByRole('button', { name: /^Correct this cut/ }).click()
      const correction = phone.getByRole('form', { name: 'Correct the cut of 30 minutes' })
      await correction.getByLabel('Minutes cut').fill('20')
      await correction.getByLabel('Why (kept in the history)').fill('Typed 30; the job ran 20')
      await check('correction-form', phone)
      await correction.getByRole('button', { name: 'Save the correction' }).click()
      await phone.getByRole('status').filter({ hasText: 'The cut was corrected.' }).waitFor()
      await expect(cutInAll.innerText()).resolves.toBe('20 min')
      await expect(lastCuts.getByRole('listitem').first().innerText()).resolves.toMatch(/20 min\s+Cast acrylic, frosted/)
      // 20 minutes at 1.5 on 600: 5 % of a life.
      await expect.poll(() => lifeUsed.getAttribute('aria-valuenow')).toBe('5')
      await check('corrected', phone)
      expect(pageErrors).toEqual([])
    } finally {
      await tablet.close()
    }

    // The owner, at the desk again, finds the totals and the correction in the cutter's history,
    // and Getting ready has gone.
    const desk = await browser.newContext({ ...DESKTOP, baseURL: baseUrl(), locale: 'en-GB', timezoneId: 'UTC' })
    desk.setDefaultTimeout(20_000)
    try {
      const owner = await desk.newPage()
      await signIn(owner, OWNER_EMAIL, OWNER_PASSWORD)
      await expect(owner.getByRole('heading', { level: 2, name: 'Getting ready' }).count()).resolves.toBe(0)
      await check('owner-home-ready', owner)

      await open(owner, '/crib')
      await owner.getByRole('link', { name: code, exact: true }).click()
      await owner.getByRole('heading', { level: 1, name: code }).waitFor()
      const history = owner.getByRole('region', { name: /^History/ })
      await history.getByText('Cut log corrected').first().waitFor()
      await expect(history.innerText()).resolves.toMatch(/Typed 30; the job ran 20/)
      // The cut itself now reads 20 minutes and 20 x 1.5 / 600 = 5.0 % of a life (Miner's rule).
      await expect(history.innerText()).resolves.toMatch(/Cut 20 min of Cast acrylic, frosted\s+Clean\s+5\.0 % of a life/)
      await expect(history.innerText()).resolves.toContain(`by ${OPERATOR}`)
      await check('cutter-history', owner)

      // The owner revokes the device at once, after a confirmation.
      await open(owner, '/crib/devices')
      const row = owner.getByRole('list', { name: 'Enrolled devices' }).getByRole('listitem').filter({ hasText: 'Tablet by router 2' })
      await expect(row.innerText()).resolves.toMatch(/last PIN sign-in/)
      let asked = ''
      owner.once('dialog', (dialog) => { asked = dialog.message(); void dialog.accept() })
      await row.getByRole('button', { name: /^Revoke/ }).click()
      await owner.getByRole('status').filter({ hasText: '"Tablet by router 2" is revoked.' }).waitFor()
      expect(asked).toMatch(/^Revoke "Tablet by router 2"\?/)
      await owner.getByText('No devices yet.').waitFor()
      await check('device-revoked', owner)
    } finally {
      await desk.close()
    }

    // Back on the device, the sign-in page is the e-mail form again.
    await open(page, '/login')
    await page.getByRole('heading', { level: 1, name: 'Sign in' }).waitFor()
    await check('device-revoked-sign-in')
  })
})
