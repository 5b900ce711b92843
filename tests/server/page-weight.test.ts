// The phone's cutter page stays light, and the ~375 KB QR decoder is fetched by the scan page only.
// Measured on the built app (.output) through the build's own manifest of which files each page needs.
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { pathToFileURL } from 'node:url'
import { gzipSync } from 'node:zlib'
import { beforeAll, describe, expect, it } from 'vitest'
import { projectRoot } from '../support/db'

interface Resource { file: string, resourceType?: string, dynamicImports?: string[] }
interface Dependencies { preload: Record<string, Resource> }
let deps: Record<string, Dependencies>

beforeAll(async () => {
  const manifest = path.join(projectRoot, '.output/server/chunks/build/client.precomputed.mjs')
  deps = (await import(pathToFileURL(manifest).href)).default.dependencies
})

/** The script files that must load before the page shows: its own chunks and what they import. */
function scriptsOf(...keys: string[]): Set<string> {
  const files = new Set<string>()
  for (const key of keys) {
    for (const r of Object.values(deps[key]!.preload)) if (r.resourceType === 'script') files.add(r.file)
  }
  return files
}

const gzipped = (file: string) => gzipSync(readFileSync(path.join(projectRoot, '.output/public/_nuxt', file)), { level: 9 }).length
const decoder = () => Object.values(deps['node_modules/html5-qrcode/esm/index.js']!.preload)[0]!.file
const ENTRY = 'node_modules/nuxt/dist/app/entry.js'

describe('what the phone downloads', () => {
  it('the cutter page needs no decoder and no validation library, and its own code stays small', () => {
    const page = scriptsOf('pages/c/[code].vue', 'layouts/default.vue')
    const entry = scriptsOf(ENTRY)
    expect(page.has(decoder())).toBe(false)
    expect(entry.has(decoder())).toBe(false)
    for (const file of page) expect(readFileSync(path.join(projectRoot, '.output/public/_nuxt', file), 'utf8')).not.toContain('ZodError')

    const own = [...page].filter((f) => !entry.has(f)).reduce((sum, f) => sum + gzipped(f), 0)
    const all = [...new Set([...page, ...entry])].reduce((sum, f) => sum + gzipped(f), 0)
    // Budgets with a little room over what was reached (docs/performance.md, the cutter page on a
    // phone): the page's own code 23.7 KB and everything 108.5 KB gzipped at level 9 (about 96 KB as
    // sent, brotli), in five files: the entry, the "app" and "cutter" chunks (nuxt.config.ts) and
    // the facades of the page and its layout. Thirty-odd small files cost a phone a request each.
    expect(own).toBeLessThan(26 * 1024)
    expect(all).toBeLessThan(112 * 1024)
    expect(new Set([...page, ...entry]).size).toBeLessThanOrEqual(5)
  })

  it('only the scan page reaches the decoder, and only through a dynamic import', () => {
    const scan = deps['pages/scan.vue']!.preload['pages/scan.vue']!
    expect(scan.dynamicImports).toContain('node_modules/html5-qrcode/esm/index.js')
    expect(scriptsOf('pages/scan.vue').has(decoder())).toBe(false)
    for (const key of Object.keys(deps).filter((k) => k.startsWith('pages/') || k.startsWith('layouts/'))) {
      expect(scriptsOf(key).has(decoder()), key).toBe(false)
    }
  })
})
