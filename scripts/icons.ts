// Draws the app's icons for the web app manifest from public/favicon.svg with Chromium:
// `node --import tsx scripts/icons.ts`. Run again after changing the mark; the PNGs are committed.
// The maskable icon keeps the mark inside the central 80 % circle that launchers may crop to
// (W3C Web App Manifest, "purpose": "maskable" safe zone).
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { chromium } from 'playwright-core'

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)))
const svg = readFileSync(path.join(root, 'public/favicon.svg'), 'utf8')
const ICONS = [
  { file: 'icon-192.png', size: 192, inset: 0 },
  { file: 'icon-512.png', size: 512, inset: 0 },
  { file: 'apple-touch-icon-180.png', size: 180, inset: 0 },
  { file: 'maskable-512.png', size: 512, inset: 0.14 },
]

const browser = await chromium.launch({ executablePath: process.env.KERFBOOK_CHROMIUM ?? '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu'] })
try {
  for (const icon of ICONS) {
    const page = await browser.newPage({ viewport: { width: icon.size, height: icon.size } })
    const pad = Math.round(icon.size * icon.inset)
    // The maskable one stands on the mark's own dark green, edge to edge, with no rounded corners.
    await page.setContent(`<html><body style="margin:0;background:${icon.inset ? '#12302b' : 'transparent'}">
      <div style="padding:${pad}px;width:${icon.size - 2 * pad}px;height:${icon.size - 2 * pad}px">${svg.replace('<svg ', '<svg width="100%" height="100%" ')}</div></body></html>`)
    await page.screenshot({ path: path.join(root, 'public/icons', icon.file), omitBackground: !icon.inset })
    await page.close()
  }
} finally {
  await browser.close()
}
