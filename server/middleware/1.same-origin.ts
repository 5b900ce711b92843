// Refuses a forged cross-site write before anything else reads it. A browser names the page a
// request comes from in Origin (and, lacking it, says in Sec-Fetch-Site how it relates to us);
// a write from any other origin (another site, or another port of this host) is refused, so a
// form on someone else's page cannot act with the cookie of a person signed in here. A client
// that sends neither header is not a browser and carries no one's cookie by accident.
// JSON routes take JSON only: an urlencoded or plain-text form (which any page may submit across
// sites without asking) is refused too; the photo and NC program uploads also take multipart.
import type { H3Event } from 'h3'

const MULTIPART_ROUTES = [/^\/api\/cutters\/[^/]+\/flag$/, /^\/api\/programs$/]
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

/** The hosts (host:port) this app answers as: the configured public address and the request's own Host. */
function ownHosts(event: H3Event): string[] {
  const config = useRuntimeConfig()
  const hosts = [getRequestHeader(event, 'host') ?? '']
  if (config.public.baseUrl) hosts.push(new URL(config.public.baseUrl).host)
  if (config.trustProxy) hosts.push(...(getRequestHeader(event, 'x-forwarded-host') ?? '').split(','))
  return hosts.map((h) => h.trim().toLowerCase()).filter(Boolean)
}

function hostOf(origin: string): string | undefined {
  try {
    return new URL(origin).host.toLowerCase() || undefined
  } catch {
    return undefined
  }
}

export default defineEventHandler((event) => {
  if (SAFE_METHODS.has(event.method) || !event.path.startsWith('/api/')) return
  const origin = getRequestHeader(event, 'origin')
  const site = getRequestHeader(event, 'sec-fetch-site')
  const foreign = origin !== undefined
    ? !ownHosts(event).includes(hostOf(origin) ?? '')
    : site !== undefined && site !== 'same-origin' && site !== 'none'
  if (foreign) {
    throw createError({ statusCode: 403, statusMessage: 'This request came from another site, so it was refused. Open Kerfbook itself and try again.' })
  }
  if (!requestHasBody(event)) return
  const type = (getRequestHeader(event, 'content-type') ?? '').split(';')[0]!.trim().toLowerCase()
  const multipart = MULTIPART_ROUTES.some((re) => re.test(event.path.split('?')[0]!))
  if (type !== 'application/json' && !(multipart && type === 'multipart/form-data')) {
    throw createError({ statusCode: 415, statusMessage: `Send the request body as JSON${multipart ? ' or multipart/form-data' : ''}.` })
  }
})
