// The app's API routes, read from the files under server/api at run time with Nitro's file
// naming: `index` is the folder itself, `[id]` a parameter, the last dotted part before `.ts`
// the method (`label.png.get.ts` is GET .../label.png). Tests key their tables by these routes,
// so a new route file without an entry fails them.
import { readdirSync } from 'node:fs'
import path from 'node:path'
import { projectRoot } from './db'

export const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const

export interface ApiRoute {
  /** `POST /api/cutters/[id]/cuts`: the method and the path with its file's parameter names. */
  key: string
  method: string
  path: string
  file: string
  params: string[]
}

export function apiRoutes(): ApiRoute[] {
  const root = path.join(projectRoot, 'server/api')
  const files = readdirSync(root, { recursive: true, withFileTypes: true })
    .filter((d) => d.isFile() && /\.(ts|js|mjs)$/.test(d.name))
    .map((d) => path.relative(root, path.join(d.parentPath, d.name)).split(path.sep).join('/'))
    .sort()
  return files.map((file) => {
    const parts = file.replace(/\.(ts|js|mjs)$/, '').split('.')
    const last = parts.at(-1)!
    // A file without a method suffix answers every method: name it ALL, which no table has.
    const method = (METHODS as readonly string[]).includes(last) ? (parts.pop(), last.toUpperCase()) : 'ALL'
    const segments = parts.join('.').split('/')
    if (segments.at(-1) === 'index') segments.pop()
    const routePath = `/api${segments.length ? `/${segments.join('/')}` : ''}`
    const params = [...routePath.matchAll(/\[(\w+)\]/g)].map((m) => m[1]!)
    return { key: `${method} ${routePath}`, method, path: routePath, file: `server/api/${file}`, params }
  })
}

/** The path with its parameters filled in (each value URL-encoded). */
export function fillPath(routePath: string, values: Record<string, string | number>): string {
  return routePath.replace(/\[(\w+)\]/g, (_, name: string) => {
    if (values[name] === undefined) throw new Error(`no value for [${name}] in ${routePath}`)
    return encodeURIComponent(String(values[name]))
  })
}

/** Table keys with no route file, and route files with no table key: both mean the table is out of date. */
export function tableProblems(table: Record<string, unknown>, testFile: string): string[] {
  const routes = apiRoutes()
  const keys = new Set(routes.map((r) => r.key))
  return [
    ...routes.filter((r) => !(r.key in table))
      .map((r) => `${r.file} (${r.key}) has no entry in ${testFile}: add '${r.key}' to its table (see DEVELOPERS.md, "Running and testing").`),
    ...Object.keys(table).filter((k) => !keys.has(k))
      .map((k) => `${testFile} lists '${k}', but no file under server/api answers it: remove or rename the entry.`),
  ]
}
