// Every label format as a thermal printer draws it: the label sheet rendered in Chromium at
// 203 dpi (8 dots a millimetre, the commonest thermal head), each label's QR code read back by
// jsQR, an independent decoder. The code keeps the quiet zone ISO/IEC 18004 asks for (four
// modules on every side, clear of the label's edge and of its text), its modules stay at least
// three printer dots wide (common practice for a clean thermal print), and no text on a label
// is smaller than 6 pt.
import jsQR from 'jsqr'
import { PNG } from 'pngjs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { LABEL_SIZE_KEYS, LABEL_SIZES, QR_QUIET_MODULES } from '../../shared/kerf/label-sizes'
import { CHROMIUM } from '../support/browser'
import { baseUrl } from '../support/http'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'
import { addSpindleFixture, type SpindleFixture } from '../support/spindle'
import { chromium, type Browser, type BrowserContext } from 'playwright-core'

const DPI = 203
const PX_PER_MM = DPI / 25.4
const ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync']

let shop: TestShop
let fx: SpindleFixture
let browser: Browser
let context: BrowserContext
let urls: Map<string, string>

beforeAll(async () => {
  shop = await makeShop('Label print')
  fx = await addSpindleFixture(shop.id, 2, 600)
  const sheet = await shop.crib.get(`/api/labels?ids=${fx.cutters.map((c) => c.id).join(',')}`)
  urls = new Map((sheet.body.labels as Array<{ code: string, url: string }>).map((l) => [l.code, l.url]))
  browser = await chromium.launch({ executablePath: CHROMIUM, args: ARGS })
  // CSS has 96 px to the inch: this scale puts 203 device pixels in each inch, as the printer does.
  context = await browser.newContext({ viewport: { width: 1000, height: 1400 }, deviceScaleFactor: DPI / 96, baseURL: baseUrl() })
  const page = await context.newPage()
  await page.goto('/login')
  await page.getByLabel('E-mail').fill(shop.emails.crib)
  await page.getByLabel('Password').fill(TEST_PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL((url) => url.pathname === '/')
  await page.close()
}, 120_000)
afterAll(async () => { await browser?.close() })

describe('labels printed at 203 dpi', { timeout: 120_000 }, () => {
  it.each(LABEL_SIZE_KEYS)('%s: the QR code reads back, keeps its quiet zone, and the text is 6 pt or more', async (key) => {
    const size = LABEL_SIZES[key]
    const page = await context.newPage()
    try {
      await page.addInitScript((k) => localStorage.setItem('kerfbook:label-size', k), key)
      await page.goto(`/labels?ids=${fx.cutters.map((c) => c.id).join(',')}`)
      // The printed size, not the on-screen preview's zoom.
      await page.emulateMedia({ media: 'print' })
      const label = page.locator('.cutter-label').first()
      await label.waitFor()
      const code = (await label.locator('.cutter-label__code').innerText()).trim()

      const geometry = await label.evaluate((el) => {
        const box = (e: Element | null) => { const r = e!.getBoundingClientRect(); return { left: r.left, top: r.top, right: r.right, bottom: r.bottom } }
        const svg = el.querySelector('.cutter-label__qr svg')!
        const path = svg.querySelector('path[stroke]')!.getAttribute('d')!
        const xs: number[] = []
        const ys: number[] = []
        let x = 0
        let y = 0
        for (const [, cmd, a, b] of path.matchAll(/([MmHhVv])\s*(-?[\d.]+)(?:\s+(-?[\d.]+))?/g)) {
          if (cmd === 'M') { x = Number(a); y = Number(b) } else if (cmd === 'm') { x += Number(a); y += Number(b ?? 0) } else if (cmd === 'h') x += Number(a)
          xs.push(x)
          ys.push(y)
        }
        const font = (sel: string) => Number.parseFloat(getComputedStyle(el.querySelector(sel)!).fontSize)
        return {
          label: box(el), qr: box(el.querySelector('.cutter-label__qr')), code: box(el.querySelector('.cutter-label__code')), short: box(el.querySelector('.cutter-label__short')),
          viewBox: Number(svg.getAttribute('viewBox')!.split(' ')[2]),
          darkFrom: { x: Math.min(...xs), y: Math.min(...ys) - 0.5 }, darkTo: { x: Math.max(...xs), y: Math.max(...ys) + 0.5 },
          fonts: [font('.cutter-label__code'), font('.cutter-label__short')],
        }
      })

      // The quiet zone is in the drawing: four modules between the outermost dark module and the box.
      const modules = geometry.viewBox - 2 * QR_QUIET_MODULES
      expect((modules - 17) % 4, 'a QR symbol is 17 + 4 x version modules wide').toBe(0)
      expect(geometry.darkFrom.x).toBeGreaterThanOrEqual(QR_QUIET_MODULES)
      expect(geometry.darkFrom.y).toBeGreaterThanOrEqual(QR_QUIET_MODULES)
      expect(geometry.darkTo.x).toBeLessThanOrEqual(geometry.viewBox - QR_QUIET_MODULES)
      expect(geometry.darkTo.y).toBeLessThanOrEqual(geometry.viewBox - QR_QUIET_MODULES)
      // The box, quiet zone and all, lies on the label, and no text enters it.
      const { label: l, qr: q } = geometry
      expect(q.left).toBeGreaterThanOrEqual(l.left - 0.01)
      expect(q.top).toBeGreaterThanOrEqual(l.top - 0.01)
      expect(q.right).toBeLessThanOrEqual(l.right + 0.01)
      expect(q.bottom).toBeLessThanOrEqual(l.bottom + 0.01)
      for (const text of [geometry.code, geometry.short]) {
        const apart = text.left >= q.right - 0.01 || text.right <= q.left + 0.01 || text.top >= q.bottom - 0.01 || text.bottom <= q.top + 0.01
        expect(apart, `text clear of the QR code on ${key}`).toBe(true)
      }
      // The box's side in CSS px is its size in mm at 96 px to the inch.
      expect((q.right - q.left) / (96 / 25.4)).toBeCloseTo(size.qrMm, 1)
      const moduleDots = (size.qrMm / geometry.viewBox) * PX_PER_MM
      expect(moduleDots, `module width in printer dots on ${key}`).toBeGreaterThanOrEqual(3)
      // 6 pt is 8 CSS px (72 pt and 96 px to the inch).
      for (const px of geometry.fonts) expect(px).toBeGreaterThanOrEqual(8 - 1e-6)

      const png = PNG.sync.read(await label.screenshot({ animations: 'disabled' }))
      const read = jsQR(new Uint8ClampedArray(png.data), png.width, png.height)
      expect(read?.data, `jsQR reads the ${key} label`).toBe(urls.get(code))
    } finally {
      await page.close()
    }
  })
})
