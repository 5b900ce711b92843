// A small HTTP client for the app under test, keeping its own session cookie like a browser.
export interface Answer<T = any> { status: number, body: T, headers: Headers }

export function baseUrl(): string {
  const url = process.env.KERFBOOK_TEST_URL
  if (!url) throw new Error('KERFBOOK_TEST_URL is not set: run the tests through `npm test`.')
  return url
}

/** The response's status, headers and body (JSON when it parses, else the text). */
async function answer<T = any>(res: Response): Promise<Answer<T>> {
  const text = await res.text()
  let parsed: unknown = text
  try {
    parsed = text ? JSON.parse(text) : null
  } catch {
    parsed = text
  }
  return { status: res.status, body: parsed as T, headers: res.headers }
}

export class Client {
  // The cookies this client holds, by name (the session and, on a shop device, the device's).
  private readonly jar = new Map<string, string>()
  constructor(private readonly extraHeaders: Record<string, string> = {}) {}

  private get cookie(): string {
    return [...this.jar].map(([name, value]) => `${name}=${value}`).join('; ')
  }

  /** The value of one cookie this client holds. */
  cookieValue(name: string): string | undefined {
    return this.jar.get(name)
  }

  /** Gives this client a cookie of another (a copied cookie, as a thief would use it). */
  setCookie(name: string, value: string) {
    this.jar.set(name, value)
  }

  async request<T = any>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<Answer<T>> {
    const init: RequestInit = {
      method,
      redirect: 'manual',
      headers: {
        accept: 'application/json',
        ...this.extraHeaders,
        ...headers,
        ...(this.cookie && { cookie: this.cookie }),
        ...(body !== undefined && !(body instanceof FormData) && { 'content-type': 'application/json' }),
      },
      body: body === undefined ? undefined : body instanceof FormData ? body : JSON.stringify(body),
    }
    const res = await fetch(baseUrl() + path, init)
    const setCookie = res.headers.getSetCookie()
    for (const c of setCookie) {
      const pair = c.split(';')[0]!
      const at = pair.indexOf('=')
      const [name, value] = [pair.slice(0, at).trim(), pair.slice(at + 1)]
      // An emptied cookie (sign-out) clears ours.
      if (value) this.jar.set(name, value)
      else this.jar.delete(name)
    }
    return answer<T>(res)
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  /** A request with a body sent as it is (any text, bytes or form) and headers of the caller's choosing. */
  async send(method: string, path: string, body?: string | Uint8Array | FormData, headers: Record<string, string> = {}): Promise<Answer> {
    const res = await fetch(baseUrl() + path, {
      method, redirect: 'manual', body: body as BodyInit | undefined,
      headers: { accept: 'application/json', ...headers, ...(this.cookie && { cookie: this.cookie }) },
    })
    return answer(res)
  }
  /** The raw response, for images and downloads, sent with this client's session. */
  raw(path: string): Promise<Response> {
    return fetch(baseUrl() + path, { redirect: 'manual', headers: this.cookie ? { cookie: this.cookie } : {} })
  }
  post<T = any>(path: string, body?: unknown, headers?: Record<string, string>) { return this.request<T>('POST', path, body ?? {}, headers) }
  patch<T = any>(path: string, body?: unknown) { return this.request<T>('PATCH', path, body ?? {}) }

  async login(email: string, password: string): Promise<Answer> {
    const res = await this.post('/api/auth/login', { email, password })
    if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status}: ${JSON.stringify(res.body)}`)
    return res
  }
}

/** Mail caught by the test mail catcher, newest last. */
export interface CaughtMessage {
  to: string[]
  subject: string
  text: string
  html: string
  attachments: Array<{ filename: string, contentType: string, contentBase64: string }>
}

export async function caughtMail(): Promise<CaughtMessage[]> {
  const res = await fetch(`${process.env.KERFBOOK_TEST_MAIL_URL}/messages.json`)
  return res.json()
}

export async function waitForMail(to: string, subjectPart: string, timeoutMs = 5000) {
  const until = Date.now() + timeoutMs
  while (Date.now() < until) {
    const found = (await caughtMail()).filter((m) => m.to.includes(to) && m.subject.includes(subjectPart)).at(-1)
    if (found) return found
    await new Promise((r) => setTimeout(r, 100))
  }
  throw new Error(`no mail to ${to} about "${subjectPart}" arrived`)
}
