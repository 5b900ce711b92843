// What Kerfbook promises an attacker and a careless user, tried against the running app: sessions
// that end, writes only from its own pages, limits that hold however a request is sent, and mail
// that cannot be turned against others. Each promise is one test; each fails without its fix.
import { randomUUID } from 'node:crypto'
import http from 'node:http'
import { sql } from 'kysely'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { appDb } from '../support/db'
import { baseUrl, caughtMail, Client, waitForMail } from '../support/http'
import { startAppInstance, type AppInstance } from '../support/instances'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'

const PASSWORD = 'a-long-enough-password'
const email = (what = 'person') => `${what}-${randomUUID().slice(0, 8)}@example.com`
const cookieOf = (res: { headers: Headers }) => res.headers.getSetCookie().map((c) => c.split(';')[0]!).find((c) => c.startsWith('kerfbook-session='))!

/** A client that sends a cookie taken from another, as someone who copied it would. */
function withCookie(cookie: string, url = baseUrl()) {
  return (method: string, path: string, body?: unknown) => fetch(url + path, {
    method, headers: { cookie, accept: 'application/json', ...(body !== undefined && { 'content-type': 'application/json' }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  })
}

async function signUp(address = email('owner')) {
  const client = new Client()
  const res = await client.post('/api/auth/signup', { shopName: `Trust shop ${randomUUID().slice(0, 6)}`, name: 'Sam Owner', email: address, password: PASSWORD })
  expect(res.status).toBe(201)
  return { client, address, res }
}

/** Makes the links mailed to an address a quarter of an hour old: no longer fresh. */
function ageLinks(db: ReturnType<typeof appDb>, address: string) {
  return sql`update auth_tokens set created_at = now() - interval '15 minutes' where user_id = (select id from users where email = ${address})`.execute(db)
}

/** The link's token from the newest mail to `to` whose subject has `subject` in it. */
async function tokenFrom(to: string, subject: string, path: string): Promise<string> {
  const mail = await waitForMail(to, subject)
  const match = new RegExp(`${path}/([A-Za-z0-9_-]+)`).exec(mail.text)
  if (!match) throw new Error(`no ${path} link in the mail to ${to}`)
  return match[1]!
}

let shop: TestShop
// A second instance of the app on the same database, with cookies that work over plain HTTP.
let second: AppInstance
const SECOND_PORT = Number(process.env.KERFBOOK_TEST_APP_PORT ?? 3311) + 50

beforeAll(async () => {
  shop = await makeShop('Trust')
  second = await startAppInstance(SECOND_PORT, process.env.KERFBOOK_TEST_DATABASE_URL!, {
    NUXT_SESSION_COOKIE_SECURE: 'false', NUXT_TRUST_PROXY: 'true',
  })
}, 60_000)

afterAll(async () => {
  await second?.stop()
})

describe('sessions end', () => {
  it('a cookie copied before sign-out stops working at sign-out, for reads and writes alike', async () => {
    const client = new Client()
    const login = await client.post('/api/auth/login', { email: shop.emails.crib, password: TEST_PASSWORD })
    const copy = withCookie(cookieOf(login))
    expect((await copy('GET', '/api/me')).status).toBe(200)
    expect((await client.post('/api/auth/logout')).status).toBe(204)
    expect((await copy('GET', '/api/me')).status).toBe(401)
    expect((await copy('GET', '/api/export/cut-logs.csv')).status).toBe(401)
    expect((await copy('POST', '/api/orders', { supplierId: 1, lines: [] })).status).toBe(401)
  })

  it('a password reset ends every session the person had', async () => {
    const { client, address } = await signUp()
    const elsewhere = new Client()
    await elsewhere.login(address, PASSWORD)
    expect((await new Client().post('/api/auth/reset-request', { email: address })).status).toBe(202)
    const token = await tokenFrom(address, 'Reset your Kerfbook password', '/reset')
    const fresh = new Client()
    expect((await fresh.post('/api/auth/reset', { token, password: 'another-long-password' })).status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(401)
    expect((await elsewhere.get('/api/me')).status).toBe(401)
    expect((await fresh.get('/api/me')).status).toBe(200)
  })

  it('a role change and switching an account off end its sessions, and switching it on again revives none', async () => {
    const s = await makeShop('Roles')
    const operatorCopy = withCookie((await new Client().login(s.emails.operator, TEST_PASSWORD).then(cookieOf)))
    const cribCopy = withCookie(await new Client().login(s.emails.crib, TEST_PASSWORD).then(cookieOf))
    expect((await s.owner.patch(`/api/users/${s.ids.crib}`, { role: 'operator' })).status).toBe(200)
    expect((await cribCopy('GET', '/api/me')).status).toBe(401)
    expect((await s.crib.get('/api/me')).status).toBe(401)
    expect((await s.owner.patch(`/api/users/${s.ids.operator}`, { active: false })).status).toBe(200)
    expect((await s.owner.patch(`/api/users/${s.ids.operator}`, { active: true })).status).toBe(200)
    expect((await operatorCopy('GET', '/api/me')).status).toBe(401)
    expect((await s.operator.get('/api/me')).status).toBe(401)
    // Signing in again works as ever.
    await new Client().login(s.emails.operator, TEST_PASSWORD)
  })

  it('"sign out everywhere" ends all of one\'s own sessions; an owner can do it for anyone in the shop', async () => {
    const s = await makeShop('Everywhere')
    const phone = new Client()
    await phone.login(s.emails.crib, TEST_PASSWORD)
    expect((await s.crib.post('/api/auth/logout-everywhere')).status).toBe(204)
    expect((await phone.get('/api/me')).status).toBe(401)
    expect((await s.crib.get('/api/me')).status).toBe(401)

    expect((await s.operator.get('/api/me')).status).toBe(200)
    expect((await s.crib.post(`/api/users/${s.ids.operator}/sign-out`)).status).toBe(401)
    expect((await s.owner.post(`/api/users/${s.ids.operator}/sign-out`)).status).toBe(204)
    expect((await s.operator.get('/api/me')).status).toBe(401)
    expect((await s.owner.get('/api/me')).status).toBe(200)
    // Another shop's person is not the owner's to sign out.
    expect((await s.owner.post(`/api/users/${shop.ids.operator}/sign-out`)).status).toBe(404)
  })

  it('an ended session ends on every instance at once, even one that opened the cookie a moment before', async () => {
    const client = new Client()
    const cookie = cookieOf(await client.post('/api/auth/login', { email: shop.emails.operator, password: TEST_PASSWORD }))
    const onSecond = withCookie(cookie, second.url)
    expect((await onSecond('GET', '/api/me')).status).toBe(200)
    expect((await client.post('/api/auth/logout')).status).toBe(204)
    expect((await onSecond('GET', '/api/me')).status).toBe(401)
    await shop.operator.login(shop.emails.operator, TEST_PASSWORD)
  })

  it('the pages are not told that an ended session is still signed in', async () => {
    const client = new Client()
    const cookie = cookieOf(await client.post('/api/auth/login', { email: shop.emails.crib, password: TEST_PASSWORD }))
    await client.post('/api/auth/logout')
    const res = await withCookie(cookie)('GET', '/api/_auth/session')
    expect(res.status).toBe(401)
    await shop.crib.login(shop.emails.crib, TEST_PASSWORD)
  })
})

describe('writes come only from the app\'s own pages', () => {
  it('a form on another port of the same host cannot invite itself in with a signed-in owner\'s cookie', async () => {
    const invited = email('intruder')
    const forged = await shop.owner.send('POST', '/api/invitations', `email=${encodeURIComponent(invited)}&name=Intruder&role=owner`, {
      'content-type': 'application/x-www-form-urlencoded', 'origin': new URL(baseUrl()).origin.replace(/:\d+$/, ':8080'), 'sec-fetch-site': 'same-site',
    })
    expect(forged.status).toBe(403)
    expect(forged.body.message).toMatch(/another site/)
    const lacksOrigin = await shop.owner.send('POST', '/api/invitations', JSON.stringify({ email: invited, name: 'Intruder', role: 'owner' }), {
      'content-type': 'application/json', 'sec-fetch-site': 'cross-site',
    })
    expect(lacksOrigin.status).toBe(403)
    const people = (await shop.owner.get('/api/users')).body as Array<{ email: string }>
    expect(people.map((p) => p.email)).not.toContain(invited)
  })

  it('the app\'s own origin passes', async () => {
    const res = await shop.owner.send('PATCH', '/api/me', JSON.stringify({ name: 'Test Owner' }), {
      'content-type': 'application/json', 'origin': new URL(baseUrl()).origin, 'sec-fetch-site': 'same-origin',
    })
    expect(res.status).toBe(200)
  })

  it.each([
    ['urlencoded', 'application/x-www-form-urlencoded', 'name=Forged'],
    ['plain text', 'text/plain', '{"name":"Forged"}'],
    ['multipart', 'multipart/form-data; boundary=x', '--x\r\nContent-Disposition: form-data; name="name"\r\n\r\nForged\r\n--x--\r\n'],
  ])('a JSON route refuses a %s body, which any page could submit across sites', async (_, type, body) => {
    const res = await shop.owner.send('PATCH', '/api/me', body, { 'content-type': type })
    expect(res.status).toBe(415)
    expect((await shop.owner.get('/api/me')).body.name).toBe('Test Owner')
  })
})

describe('settings that are offered work', () => {
  it('NUXT_SESSION_COOKIE_SECURE=false lets a phone keep its session over plain HTTP; by default the cookie is Secure', async () => {
    const own = await new Client().post('/api/auth/login', { email: shop.emails.crib, password: TEST_PASSWORD })
    expect(own.headers.getSetCookie().find((c) => c.startsWith('kerfbook-session='))).toMatch(/;\s*Secure/i)
    const res = await fetch(`${second.url}/api/auth/login`, {
      method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: shop.emails.crib, password: TEST_PASSWORD }),
    })
    expect(res.status).toBe(200)
    expect(res.headers.getSetCookie().find((c) => c.startsWith('kerfbook-session='))).not.toMatch(/;\s*Secure/i)
  })

  it('behind a trusted proxy, the address is the one the proxy added, not what the client wrote before it', async () => {
    // 30 failures from one real address, each with a different made-up address first.
    const real = `203.0.113.${Math.floor(Math.random() * 200) + 20}`
    for (let i = 0; i < 30; i++) {
      const res = await new Client({ 'x-forwarded-for': `10.9.${i}.1, ${real}` }).post('/api/auth/login', { email: email('nobody'), password: 'guess' })
      expect(res.status).toBe(401)
    }
    const blocked = await new Client({ 'x-forwarded-for': `10.9.250.1, ${real}` }).post('/api/auth/login', { email: shop.emails.crib, password: TEST_PASSWORD })
    expect(blocked.status).toBe(429)
    expect(blocked.body.message).toMatch(/this network address/)
  })
})

/** Sends `total` bytes of a JSON-looking body in chunks (no Content-Length) and answers the status. */
function sendChunked(path: string, total: number, headers: Record<string, string> = {}): Promise<number> {
  return new Promise((resolve, reject) => {
    const url = new URL(baseUrl() + path)
    const req = http.request({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST', headers: { 'content-type': 'application/json', ...headers } })
    req.on('response', (res) => {
      res.resume()
      resolve(res.statusCode!)
    })
    // The server may close the connection once it has answered: that is the point.
    req.on('error', (err: NodeJS.ErrnoException) => (['EPIPE', 'ECONNRESET'].includes(err.code ?? '') ? undefined : reject(err)))
    const chunk = Buffer.alloc(64 * 1024, 'a')
    let sent = 0
    req.write('{"email":"')
    const pump = () => {
      while (sent < total) {
        sent += chunk.length
        if (!req.write(chunk)) return void req.once('drain', pump)
      }
      req.end('"}')
    }
    pump()
  })
}

describe('limits hold however the body is sent', () => {
  it('an 8 MB chunked body to sign-in is refused at the limit, not read and parsed', async () => {
    expect(await sendChunked('/api/auth/login', 8 * 1024 * 1024)).toBe(413)
    expect((await new Client().get('/api/me')).status).toBe(401)
  })

  it('the CSV import and the photo limits count bytes too, whatever the headers say', async () => {
    expect(await sendChunked('/api/import/cutters', 4 * 1024 * 1024, { cookie: await shop.crib.login(shop.emails.crib, TEST_PASSWORD).then(cookieOf) })).toBe(413)
    expect(await sendChunked('/api/cutters/1/flag', 12 * 1024 * 1024)).toBe(413)
  })
})

describe('sign-in throttling cannot be raced or turned against a person', () => {
  it('ten wrong passwords at once get five tries, and the person still signs in from elsewhere', async () => {
    const { address } = await signUp()
    const attacker = `198.51.100.${Math.floor(Math.random() * 200) + 20}`
    const answers = await Promise.all(Array.from({ length: 10 }, (_, i) =>
      new Client({ 'x-forwarded-for': attacker }).post('/api/auth/login', { email: address, password: `wrong-${i}` })))
    const statuses = answers.map((a) => a.status).sort()
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429, 429, 429, 429, 429])
    expect((await new Client({ 'x-forwarded-for': attacker }).post('/api/auth/login', { email: address, password: PASSWORD })).status).toBe(429)
    expect((await new Client({ 'x-forwarded-for': '192.0.2.44' }).post('/api/auth/login', { email: address, password: PASSWORD })).status).toBe(200)
  })
})

describe('mail cannot be turned against others', () => {
  it('a new shop mails no one else until its owner confirms their address through the link mailed to them', async () => {
    const { client, address } = await signUp()
    expect((await client.get('/api/me')).body.emailConfirmed).toBe(false)
    const invited = email('invitee')
    const early = await client.post('/api/invitations', { email: invited, name: 'Early Bird', role: 'operator' })
    expect(early.status).toBe(403)
    expect(early.body.message).toMatch(/confirms their e-mail address/)
    const token = await tokenFrom(address, 'Confirm your e-mail address', '/confirm')
    // Confirming needs no session: the link may be opened on another device.
    const confirmed = await new Client().post('/api/auth/confirm', { token })
    expect(confirmed.status).toBe(200)
    expect((await new Client().post('/api/auth/confirm', { token })).status).toBe(404)
    expect((await client.get('/api/me')).body.emailConfirmed).toBe(true)
    expect((await client.post('/api/invitations', { email: invited, name: 'Early Bird', role: 'operator' })).status).toBe(201)
    await waitForMail(invited, 'invited')
  })

  it('the confirmation link can be sent again, but not while the last one is fresh, and not once confirmed', async () => {
    const { client, address } = await signUp()
    await waitForMail(address, 'Confirm your e-mail address')
    const soon = await client.post('/api/me/confirmation')
    expect(soon.status).toBe(202)
    expect(soon.body.sent).toBe(false)
    const db = appDb()
    try {
      await ageLinks(db, address)
    } finally {
      await db.destroy()
    }
    const later = await client.post('/api/me/confirmation')
    expect(later.body.sent).toBe(true)
    await new Client().post('/api/auth/confirm', { token: await tokenFrom(address, 'Confirm your e-mail address', '/confirm') })
    expect((await client.post('/api/me/confirmation')).status).toBe(409)
  })

  it('a shop sends at most its hourly limit of mail', async () => {
    const s = await makeShop('Chatty')
    const db = appDb()
    try {
      // 99 mails already this hour; the limit is 100 (nuxt.config.ts, mailLimits).
      await db.insertInto('shop_mails').values({ shop_id: s.id, kind: 'invitation', recipients: 99 }).execute()
    } finally {
      await db.destroy()
    }
    expect((await s.owner.post('/api/invitations', { email: email('one'), name: 'One More', role: 'operator' })).status).toBe(201)
    const over = await s.owner.post('/api/invitations', { email: email('two'), name: 'Too Many', role: 'operator' })
    expect(over.status).toBe(429)
    expect(over.body.message).toMatch(/at most 100 an hour/)
  })

  it('reset requests sent at once mail one link, which a later request neither cancels nor follows; an address gets three an hour', async () => {
    const { address } = await signUp()
    const count = async () => (await caughtMail()).filter((m) => m.to.includes(address) && m.subject.includes('Reset')).length
    const answers = await Promise.all(Array.from({ length: 8 }, () => new Client().post('/api/auth/reset-request', { email: address })))
    expect(answers.every((a) => a.status === 202)).toBe(true)
    const token = await tokenFrom(address, 'Reset your Kerfbook password', '/reset')
    expect(await count()).toBe(1)
    await new Client().post('/api/auth/reset-request', { email: address })
    expect(await count()).toBe(1)
    // The link of the first mail still works: the later requests did not cancel it.
    expect((await new Client().post('/api/auth/reset', { token, password: 'a-new-long-password' })).status).toBe(200)
    // Once the link is no longer fresh, a new one may go, up to three in the hour.
    const db = appDb()
    const age = () => ageLinks(db, address)
    try {
      for (const expected of [2, 3, 3]) {
        await age()
        await new Client().post('/api/auth/reset-request', { email: address })
        await new Promise((r) => setTimeout(r, 300))
        expect(await count()).toBe(expected)
      }
    } finally {
      await db.destroy()
    }
  })
})

describe('answers stay in proportion to the question', () => {
  it('a CSV dry run with many unknown columns answers a few times its size at most, and lists the known columns once', async () => {
    const header = Array.from({ length: 300 }, (_, i) => `c${i}`).join(',')
    const csv = `${header}\n${Array.from({ length: 300 }, () => 'x').join(',')}\n`
    const res = await shop.crib.send('POST', '/api/import/cutters', JSON.stringify({ csv, dryRun: true }), { 'content-type': 'application/json' })
    expect(res.status).toBe(200)
    const size = Buffer.byteLength(JSON.stringify(res.body))
    expect(size).toBeLessThan(4 * csv.length + 4096)
    const unknown = res.body.errors.filter((e: { message: string }) => /unknown column/.test(e.message))
    expect(unknown).toHaveLength(1)
  })

  it('a file wrong on every row answers at most a hundred problems and says how many more', async () => {
    const csv = `type,status\n${Array.from({ length: 3000 }, (_, i) => `No such type ${i},in_crib`).join('\n')}\n`
    const res = await shop.crib.send('POST', '/api/import/cutters', JSON.stringify({ csv, dryRun: true }), { 'content-type': 'application/json' })
    expect(res.body.errors).toHaveLength(100)
    expect(res.body.errors.at(-1).message).toMatch(/^and 2901 more problems/)
  })
})
