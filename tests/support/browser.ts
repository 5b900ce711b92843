// Headless Chromium for the browser journeys: Debian's build (scripts/test.sh installs it), a
// phone or desktop context on the app under test, a screenshot of each step kept under
// test-results/journeys/, and axe-core run on each page the journey reaches.
import { mkdirSync, rmSync } from 'node:fs'
import path from 'node:path'
import axe from 'axe-core'
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core'
import { expect } from 'vitest'
import { projectRoot } from './db'
import { baseUrl } from './http'

export const CHROMIUM = process.env.KERFBOOK_CHROMIUM ?? '/usr/bin/chromium'
// The background-networking switches keep Chromium from calling out on a closed network.
const ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync']

export const PHONE = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, isMobile: true, hasTouch: true }
export const DESKTOP = { viewport: { width: 1280, height: 800 } }

// WCAG 2.0, 2.1 and 2.2 at levels A and AA, as axe-core tags them.
const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa']
const BLOCKING = new Set(['serious', 'critical'])

/** How long one journey may take, under load. */
export const JOURNEY_TIMEOUT = 120_000

export interface Journey {
  browser: Browser
  context: BrowserContext
  /** Where the screenshots go. */
  folder: string
  page: Page
  /** Screenshots the page (or `other`) as step `name` and checks it with axe; a serious or critical finding fails the test. */
  check: (name: string, other?: Page) => Promise<void>
  close: () => Promise<void>
}

/** The browser's language and clock: British English on UTC unless a journey says otherwise. */
export interface Reader { locale: string, timezoneId: string }

export async function startJourney(name: string, device: typeof PHONE | typeof DESKTOP, reader: Reader = { locale: 'en-GB', timezoneId: 'UTC' }): Promise<Journey> {
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: ARGS })
  const context = await browser.newContext({ ...device, baseURL: baseUrl(), ...reader })
  // Generous: the suite shares two cores with the other server tests.
  context.setDefaultTimeout(20_000)
  const page = await context.newPage()
  const errors: string[] = []
  context.on('weberror', (err) => errors.push(err.error().message))
  // Vue catches errors thrown in setup and watchers and only logs them: those count too.
  context.on('console', (message) => {
    if (message.type() === 'error') errors.push(`${message.text()} (${message.page()?.url()})`)
  })
  const folder = path.join(projectRoot, 'test-results', 'journeys', name)
  rmSync(folder, { recursive: true, force: true })
  mkdirSync(folder, { recursive: true })
  let step = 0

  async function check(stepName: string, target: Page = page) {
    step++
    // The whole page in one picture, with the sticky top bar and the fixed tab bar where a person
    // sees them: the window is made as tall as the page for the shot, then put back.
    const size = target.viewportSize()!
    await target.evaluate(() => window.scrollTo(0, 0))
    const height = await target.evaluate(() => document.documentElement.scrollHeight)
    if (height > size.height) await target.setViewportSize({ width: size.width, height })
    await target.screenshot({ path: path.join(folder, `${String(step).padStart(2, '0')}-${stepName}.png`) })
    if (height > size.height) await target.setViewportSize(size)
    const found = await audit(target)
    expect.soft(found, `axe-core found serious or critical problems at "${stepName}" (${target.url()})`).toEqual([])
    expect.soft(errors.splice(0), `the page threw or logged errors by "${stepName}"`).toEqual([])
  }

  return {
    browser, context, page, check, folder,
    close: () => browser.close(),
  }
}

/** axe-core's serious and critical violations on the page as it stands, one line each. */
export async function audit(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ content: axe.source })
  const violations = await page.evaluate(async (tags) => {
    const run = await (window as unknown as { axe: typeof axe }).axe.run(document, { runOnly: { type: 'tag', values: tags } })
    return run.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, targets: v.nodes.map((n) => n.target.join(' ')) }))
  }, WCAG_TAGS)
  // KERFBOOK_AXE_ALL=1 also prints the moderate and minor findings, which do not fail the test.
  if (process.env.KERFBOOK_AXE_ALL) {
    for (const v of violations) console.log(`[axe] ${page.url()} ${v.impact} ${v.id}: ${v.help} -> ${v.targets.join(' | ')}`)
  }
  return violations
    .filter((v) => v.impact && BLOCKING.has(v.impact))
    .map((v) => `${v.impact} ${v.id}: ${v.help} -> ${v.targets.slice(0, 8).join(' | ')}${v.targets.length > 8 ? ` (+${v.targets.length - 8} more)` : ''}`)
}

/** Opens each page again in a phone-sized window with the same session, waits for its heading,
 *  and screenshots and checks it: the pages a desk journey visits must work on a phone too. */
export async function atPhoneWidth(journey: Journey, visits: Array<{ name: string, path: string, heading: string | RegExp }>) {
  const phone = await journey.browser.newContext({ ...PHONE, baseURL: baseUrl(), locale: 'en-GB', timezoneId: 'UTC', storageState: await journey.context.storageState() })
  phone.setDefaultTimeout(20_000)
  try {
    const page = await phone.newPage()
    for (const visit of visits) {
      await open(page, visit.path)
      await page.getByRole('heading', { level: 1, name: visit.heading }).waitFor().catch(async (err: Error) => {
        await page.screenshot({ path: path.join(journey.folder, `failed-phone-${visit.name}.png`), fullPage: true })
        throw err
      })
      // Nothing wider than the phone: a page that scrolls sideways hides its right-hand side.
      await expect(page.evaluate(() => document.documentElement.scrollWidth), `${visit.path} is wider than the phone`).resolves.toBeLessThanOrEqual(PHONE.viewport.width)
      await journey.check(`phone-${visit.name}`, page)
    }
  } finally {
    await phone.close()
  }
}

/** Waits until Nuxt has hydrated the server-rendered page, so that clicks reach their handlers. */
export async function hydrated(page: Page) {
  await page.waitForFunction(() => {
    const app = (document.getElementById('__nuxt') as (HTMLElement & { __vue_app__?: { $nuxt?: { isHydrating?: boolean } } }) | null)?.__vue_app__
    return Boolean(app?.$nuxt && !app.$nuxt.isHydrating)
  })
}

/** Opens a path and waits for the page to be live. */
export async function open(page: Page, to: string) {
  await page.goto(to)
  await hydrated(page)
}

/** Signs in through the form, as a person would, and waits for the home page. */
export async function signIn(page: Page, email: string, password: string) {
  await open(page, '/login')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL((url) => url.pathname === '/')
  await page.getByRole('banner').getByRole('button', { name: 'Sign out' }).waitFor()
}
