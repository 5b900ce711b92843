// `npm run analyze:client`: what the phone's JavaScript is made of. Builds the app with
// rollup-plugin-visualizer's raw data (KERFBOOK_ANALYZE=1, nuxt.config.ts), then prints every client
// chunk with its size as sent (the build's own .br file) and, for the chunks named as arguments
// (a file name or part of one; default: the entry chunk), the packages and source files inside
// them by their share of the minified code.
//   npm run analyze:client               the chunks, then the entry's contents
//   npm run analyze:client -- CHf8 Co    the contents of those chunks
import { readFileSync, statSync, existsSync } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'

interface Raw {
  nodeParts: Record<string, { renderedLength: number }>
  nodeMetas: Record<string, { id: string, moduleParts: Record<string, string> }>
}
const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)))
const raw = JSON.parse(readFileSync(path.join(root, '.data/analyze-client.json'), 'utf8')) as Raw
const chunks = new Map<string, { id: string, bytes: number }[]>()
for (const meta of Object.values(raw.nodeMetas)) {
  for (const [bundle, part] of Object.entries(meta.moduleParts)) {
    const list = chunks.get(bundle) ?? []
    list.push({ id: meta.id, bytes: raw.nodeParts[part]!.renderedLength })
    chunks.set(bundle, list)
  }
}
const sent = (bundle: string) => {
  const br = path.join(root, '.output/public', `${bundle}.br`)
  return existsSync(br) ? statSync(br).size : statSync(path.join(root, '.output/public', bundle)).size
}
/** A module's package, or its path in the project. */
const owner = (id: string) => id.match(/node_modules\/((?:@[^/]+\/)?[^/]+)/)?.[1] ?? id.replace(root, '').replace(/\?.*$/, '')
const kb = (n: number) => (n / 1024).toFixed(1).padStart(7)

const rows = [...chunks].map(([bundle, mods]) => ({ bundle, mods, code: mods.reduce((a, m) => a + m.bytes, 0), sent: sent(bundle) }))
  .sort((a, b) => b.sent - a.sent)
console.log('   sent    code  chunk  (largest module)')
for (const r of rows) {
  const top = [...r.mods].sort((a, b) => b.bytes - a.bytes)[0]!
  console.log(`${kb(r.sent)} ${kb(r.code)}  ${r.bundle}  (${owner(top.id)})`)
}
const wanted = process.argv.slice(2)
for (const r of rows.filter((row) => (wanted.length ? wanted.some((w) => row.bundle.includes(w)) : row === rows.find((x) => x.mods.some((m) => m.id.includes('nuxt/dist/app/entry')))))) {
  console.log(`\n${r.bundle}: ${kb(r.sent).trim()} KB sent, ${kb(r.code).trim()} KB of minified code`)
  const by = new Map<string, number>()
  for (const m of r.mods) by.set(owner(m.id), (by.get(owner(m.id)) ?? 0) + m.bytes)
  for (const [name, bytes] of [...by].sort((a, b) => b[1] - a[1]).slice(0, 40)) console.log(`${kb(bytes)}  ${name}`)
}
