// Operators on a shared shop device: a crib manager or owner enrols a browser (an HttpOnly
// cookie holding a token whose hash alone is stored), gives operators PINs (hashed as passwords
// are), adds operators without e-mail by name only; on the device, a name and PIN sign in as
// that operator of that shop, on that device only, throttled per operator and per device; a
// revoked device signs no one in and its PIN sessions end at once.
import { createHash } from 'node:crypto'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { beforeAll, describe, expect, it } from 'vitest'
import { withDb } from '../support/db'
import { Client } from '../support/http'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'

const DEVICE_COOKIE = 'kerfbook-device'
const sha256 = (s: string) => createHash('sha256').update(s).digest('hex')

/** A browser signed in as the shop's crib manager, enrolled as a device named `name`. */
async function enrolled(shop: TestShop, name: string) {
  const tablet = new Client()
  await tablet.login(shop.emails.crib, TEST_PASSWORD)
  const res = await tablet.post('/api/devices', { name })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return { tablet, device: res.body.device as { id: number, name: string }, res }
}

async function givePin(shop: TestShop, userId: number, pin: string) {
  const res = await shop.crib.request('PUT', `/api/users/${userId}/pin`, { pin })
  expect(res.status, JSON.stringify(res.body)).toBe(200)
}

async function addOperator(shop: TestShop, name: string, pin: string): Promise<number> {
  const res = await shop.crib.post('/api/users', { name, pin })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body.id
}

let shop: TestShop
let other: TestShop
beforeAll(async () => {
  [shop, other] = await Promise.all([makeShop('Devices'), makeShop('Devices other')])
})

describe('enrolling, listing and revoking shop devices', () => {
  it('enrols this browser with an HttpOnly, SameSite=Lax, Secure cookie whose token is stored only as its hash', async () => {
    const { tablet, device, res } = await enrolled(shop, 'Tablet by router 2')
    const cookie = res.headers.getSetCookie().find((c) => c.startsWith(`${DEVICE_COOKIE}=`))!
    expect(cookie).toMatch(/;\s*HttpOnly/i)
    expect(cookie).toMatch(/;\s*SameSite=Lax/i)
    // The test app runs with the session cookie's default, Secure (tests/server/security.test.ts).
    expect(cookie).toMatch(/;\s*Secure/i)
    expect(cookie).toMatch(/;\s*Path=\//i)
    const token = tablet.cookieValue(DEVICE_COOKIE)!
    expect(token).toMatch(/^[\w-]{43}$/)
    const row = await withDb((db) => db.selectFrom('shop_devices').selectAll().where('id', '=', device.id).executeTakeFirstOrThrow())
    expect(row).toMatchObject({ shop_id: shop.id, name: 'Tablet by router 2', enrolled_by: shop.ids.crib, last_used_at: null, revoked_at: null })
    expect(row.token_hash).toBe(sha256(token))
    expect(JSON.stringify(row)).not.toContain(token)

    const list = await shop.owner.get('/api/devices')
    expect(list.status).toBe(200)
    const listed = list.body.devices.find((d: { id: number }) => d.id === device.id)
    expect(listed).toMatchObject({ name: 'Tablet by router 2', enrolledBy: 'Test Crib', lastUsedAt: null, thisBrowser: false })
    expect((await tablet.get('/api/devices')).body.devices.find((d: { id: number }) => d.id === device.id).thisBrowser).toBe(true)
    // Another shop sees none of it.
    expect((await other.owner.get('/api/devices')).body.devices.map((d: { id: number }) => d.id)).not.toContain(device.id)
  })

  it('refuses a nameless device and a second live device of the same name in any case, naming the field', async () => {
    const { tablet } = await enrolled(shop, 'Phone at the saw')
    const empty = await tablet.post('/api/devices', { name: '   ' })
    expect(empty.status).toBe(400)
    expect(empty.body.data.fields.name).toMatch(/name this device/)
    const again = await shop.owner.post('/api/devices', { name: 'PHONE AT THE SAW' })
    expect(again.status).toBe(409)
    expect(again.body.data.fields.name).toBeDefined()
    expect(again.body.message).toMatch(/Another device of the shop is called/)
  })

  it('an operator can neither enrol, list nor revoke devices', async () => {
    expect((await shop.operator.post('/api/devices', { name: 'My phone' })).status).toBe(403)
    expect((await shop.operator.get('/api/devices')).status).toBe(403)
  })

  it('revokes a device at once (after which it is gone from the list); revoking twice says so, another shop\'s is not found', async () => {
    const { device } = await enrolled(shop, 'Old tablet')
    const res = await shop.owner.post(`/api/devices/${device.id}/revoke`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ id: device.id, revoked: true })
    expect((await shop.owner.get('/api/devices')).body.devices.map((d: { id: number }) => d.id)).not.toContain(device.id)
    const twice = await shop.owner.post(`/api/devices/${device.id}/revoke`)
    expect(twice.status).toBe(409)
    expect(twice.body.message).toMatch(/already revoked/)
    expect((await other.owner.post(`/api/devices/${device.id}/revoke`)).status).toBe(404)
    // A revoked device's name is free again.
    await enrolled(shop, 'Old tablet')
  })
})

describe('giving operators PINs', () => {
  it('takes 4 to 8 digits and nothing else, refuses obvious ones, and stores the PIN hashed as passwords are', async () => {
    const id = shop.ids.operator
    for (const [pin, why] of [['123', /4 to 8 digits/], ['123456789', /4 to 8 digits/], ['12a4', /4 to 8 digits/], ['', /4 to 8 digits/],
      ['1234', /straight run/], ['0000', /all the same/], ['98765', /straight run/]] as const) {
      const res = await shop.crib.request('PUT', `/api/users/${id}/pin`, { pin })
      expect(res.status, pin).toBe(400)
      expect(res.body.data.fields.pin, pin).toMatch(why)
    }
    const typed = await shop.crib.request('PUT', `/api/users/${id}/pin`, { pin: '2580' })
    expect(typed.status).toBe(200)
    expect(typed.body).toMatchObject({ id, pin: '2580' })
    // Hashed as the passwords are: an independent scrypt verifier (@adonisjs/hash, the format
    // nuxt-auth-utils writes) accepts it, and the PIN itself is nowhere in the row.
    const row = await withDb((db) => db.selectFrom('users').select(['pin_hash']).where('id', '=', id).executeTakeFirstOrThrow())
    expect(row.pin_hash).not.toContain('2580')
    await expect(new Hash(new Scrypt({})).verify(row.pin_hash!, '2580')).resolves.toBe(true)

    const made = await shop.crib.request('PUT', `/api/users/${id}/pin`, {})
    expect(made.status).toBe(200)
    expect(made.body.pin).toMatch(/^\d{6}$/)
    // Shown once: the list says only that there is one.
    const list = await shop.crib.get('/api/devices')
    expect(list.body.operators.find((o: { id: number }) => o.id === id)).toMatchObject({ hasPin: true })
    expect(JSON.stringify(list.body)).not.toContain(made.body.pin)
  })

  it('gives PINs to operators only, in the shop only; setting one ends the operator\'s sessions', async () => {
    const crib = await shop.owner.request('PUT', `/api/users/${shop.ids.crib}/pin`, { pin: '4826' })
    expect(crib.status).toBe(409)
    expect(crib.body.message).toMatch(/PINs are for operators/)
    expect((await other.crib.request('PUT', `/api/users/${shop.ids.operator}/pin`, { pin: '4826' })).status).toBe(404)

    const s = await makeShop('Devices pin ends')
    expect((await s.operator.request('PUT', `/api/users/${s.ids.operator}/pin`, { pin: '4826' })).status).toBe(403)
    expect((await s.operator.get('/api/me')).status).toBe(200)
    await givePin(s, s.ids.operator, '4826')
    expect((await s.operator.get('/api/me')).status).toBe(401)
  })

  it('adds an operator by name only, with no e-mail; a name already in the shop in any case answers 409', async () => {
    const s = await makeShop('Devices name only')
    const res = await s.crib.post('/api/users', { name: 'Dana K', pin: '4821' })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: 'Dana K', pin: '4821' })
    const made = await s.crib.post('/api/users', { name: 'Lee' })
    expect(made.body.pin).toMatch(/^\d{6}$/)
    const row = await withDb((db) => db.selectFrom('users').select(['email', 'role', 'password_hash', 'shop_id']).where('id', '=', res.body.id).executeTakeFirstOrThrow())
    expect(row).toEqual({ email: null, role: 'operator', password_hash: null, shop_id: s.id })
    const dup = await s.crib.post('/api/users', { name: 'dana k', pin: '4821' })
    expect(dup.status).toBe(409)
    expect(dup.body.data.fields.name).toBeDefined()
    expect((await s.crib.post('/api/users', { name: '', pin: '4821' })).body.data.fields.name).toBeDefined()
    expect((await s.operator.post('/api/users', { name: 'Sneaky', pin: '4821' })).status).toBe(403)

    // The owner's team list shows them as active, with no e-mail.
    const team = await s.owner.get('/api/users')
    expect(team.body.find((p: { id: number }) => p.id === res.body.id)).toMatchObject({ email: null, status: 'active', hasPin: true, role: 'operator' })
    // A PIN works for operators only, so someone with no e-mail cannot be given another role.
    const promote = await s.owner.patch(`/api/users/${res.body.id}`, { role: 'crib_manager' })
    expect(promote.status).toBe(409)
    expect(promote.body.message).toMatch(/^Dana K has no e-mail address and signs in with a PIN/)

    // Signed in on a device, they have no address to confirm and no password to change.
    const { tablet } = await enrolled(s, 'Tablet name only')
    expect((await tablet.post('/api/auth/pin', { userId: res.body.id, pin: '4821' })).status).toBe(200)
    const me = await tablet.get('/api/me')
    expect(me.body).toMatchObject({ name: 'Dana K', email: null })
    const confirm = await tablet.post('/api/me/confirmation')
    expect(confirm.status).toBe(409)
    expect(confirm.body.message).toMatch(/no e-mail address to confirm/)
    const password = await tablet.post('/api/me/password', { currentPassword: '4821', newPassword: 'a-long-new-password' })
    expect(password.status).toBe(400)
    expect(password.body.data.fields.currentPassword).toMatch(/PIN/)
  })
})

describe('signing in by name and PIN on a shop device', () => {
  it('lists the shop\'s operators with a PIN on an enrolled device only, and signs one in there, bound to that device', async () => {
    const s = await makeShop('Devices sign-in')
    const dana = await addOperator(s, 'Dana K', '4821')
    await addOperator(s, 'Lee', '7391')
    await s.crib.post('/api/users', { name: 'Switched Off', pin: '5173' }).then((r) => s.owner.patch(`/api/users/${r.body.id}`, { active: false }))
    const { tablet, device } = await enrolled(s, 'Tablet by router 1')

    expect((await new Client().get('/api/auth/device')).body).toEqual({ device: null, operators: [] })
    const listed = await tablet.get('/api/auth/device')
    expect(listed.body.device).toEqual({ name: 'Tablet by router 1', shopName: expect.stringMatching(/^Devices sign-in shop/) })
    // Only active operators with a PIN: not the operator without one, the crib manager or the one switched off.
    expect(listed.body.operators.map((o: { name: string }) => o.name)).toEqual(['Dana K', 'Lee'])

    // Off an enrolled device, a right PIN opens nothing.
    const elsewhere = await new Client().post('/api/auth/pin', { userId: dana, pin: '4821' })
    expect(elsewhere.status).toBe(403)
    expect(elsewhere.body.message).toMatch(/not one of the shop's devices/)

    const res = await tablet.post('/api/auth/pin', { userId: dana, pin: '4821' })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ id: dana, name: 'Dana K', role: 'operator', email: null })
    expect((await tablet.get('/api/me')).body).toMatchObject({ id: dana })
    const session = await withDb((db) => db.selectFrom('user_sessions').select('device_id').where('user_id', '=', dana).execute())
    expect(session).toEqual([{ device_id: device.id }])
    const used = (await s.owner.get('/api/devices')).body.devices.find((d: { id: number }) => d.id === device.id)
    expect(Date.now() - new Date(used.lastUsedAt).getTime()).toBeLessThan(60_000)

    // The session cookie copied to another browser, without the device's cookie, is refused.
    const copy = new Client()
    copy.setCookie('kerfbook-session', tablet.cookieValue('kerfbook-session')!)
    const stolen = await copy.get('/api/me')
    expect(stolen.status).toBe(401)
    expect(stolen.body.message).toMatch(/only on the shop device/)
    expect((await tablet.get('/api/me')).status).toBe(200)
  })

  it('refuses another shop\'s operator, an operator with no PIN, a crib manager and one switched off, even with the right digits', async () => {
    const s = await makeShop('Devices refusals')
    const { tablet } = await enrolled(s, 'Shared phone')
    const stranger = await addOperator(other, `Stranger ${Date.now()}`, '6142')
    const refused = await tablet.post('/api/auth/pin', { userId: stranger, pin: '6142' })
    expect(refused.status).toBe(401)
    expect(refused.body.message).toBe('Wrong PIN. Try again, or ask the crib manager for a new one.')
    // The operator made by makeShop has a password but no PIN.
    expect((await tablet.post('/api/auth/pin', { userId: s.ids.operator, pin: '6142' })).status).toBe(401)
    expect((await tablet.post('/api/auth/pin', { userId: s.ids.crib, pin: '6142' })).status).toBe(401)

    const kim = await addOperator(s, 'Kim', '3917')
    expect((await s.owner.patch(`/api/users/${kim}`, { active: false })).status).toBe(200)
    const off = await tablet.post('/api/auth/pin', { userId: kim, pin: '3917' })
    expect(off.status).toBe(401)
    expect(off.body.message).toMatch(/switched off/)
    // A PIN taken away opens nothing either.
    const jo = await addOperator(s, 'Jo', '8143')
    expect((await s.crib.request('DELETE', `/api/users/${jo}/pin`)).status).toBe(200)
    expect((await tablet.post('/api/auth/pin', { userId: jo, pin: '8143' })).status).toBe(401)
    // Bad shapes are told apart from wrong digits.
    const shape = await tablet.post('/api/auth/pin', { userId: jo, pin: '12' })
    expect(shape.status).toBe(400)
    expect(shape.body.data.fields.pin).toMatch(/4 to 8 digits/)
  })

  it('a revoked device signs no one in, and the PIN sessions started on it end at once', async () => {
    const s = await makeShop('Devices revoked')
    const ana = await addOperator(s, 'Ana', '5829')
    const { tablet, device } = await enrolled(s, 'Tablet to revoke')
    const spare = new Client()
    spare.setCookie(DEVICE_COOKIE, tablet.cookieValue(DEVICE_COOKIE)!)
    expect((await tablet.post('/api/auth/pin', { userId: ana, pin: '5829' })).status).toBe(200)
    expect((await tablet.get('/api/me')).status).toBe(200)

    expect((await s.owner.post(`/api/devices/${device.id}/revoke`)).status).toBe(200)
    const after = await tablet.get('/api/me')
    expect(after.status).toBe(401)
    await expect(withDb((db) => db.selectFrom('user_sessions').select('id').where('device_id', '=', device.id).execute())).resolves.toEqual([])
    const again = await spare.post('/api/auth/pin', { userId: ana, pin: '5829' })
    expect(again.status).toBe(403)
    expect((await spare.get('/api/auth/device')).body.device).toBeNull()
    // Ana's password-less account is untouched: on another enrolled device her PIN still works.
    const { tablet: next } = await enrolled(s, 'New tablet')
    expect((await next.post('/api/auth/pin', { userId: ana, pin: '5829' })).status).toBe(200)
  })

  it('after five wrong PINs an operator is locked out of that device, even with the right one; others still sign in there', async () => {
    const s = await makeShop('Devices throttle operator')
    const sam = await addOperator(s, 'Sam', '4937')
    const ria = await addOperator(s, 'Ria', '6251')
    const { tablet } = await enrolled(s, 'Tablet throttle')
    for (let i = 0; i < 5; i++) expect((await tablet.post('/api/auth/pin', { userId: sam, pin: '1111' })).status).toBe(401)
    const locked = await tablet.post('/api/auth/pin', { userId: sam, pin: '4937' })
    expect(locked.status).toBe(429)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(locked.body.message).toMatch(/^Too many failed sign-ins for this operator on this device\. Wait \d+ minute\(s\) or ask the crib manager for a new PIN\.$/)
    expect((await tablet.post('/api/auth/pin', { userId: ria, pin: '6251' })).status).toBe(200)
  })

  it('after fifteen wrong PINs on one device, it signs no one in for a while', async () => {
    const s = await makeShop('Devices throttle device')
    const ops = await Promise.all([['A One', '4938'], ['B Two', '5847'], ['C Three', '6153'], ['D Four', '7638']].map(([name, pin]) => addOperator(s, name!, pin!)))
    const { tablet } = await enrolled(s, 'Tablet guessed at')
    // Five wrong for each of three operators: none passes its own limit before the fifth.
    for (const id of ops.slice(0, 3)) {
      for (let i = 0; i < 5; i++) expect((await tablet.post('/api/auth/pin', { userId: id, pin: '2222' })).status).toBe(401)
    }
    const locked = await tablet.post('/api/auth/pin', { userId: ops[3]!, pin: '7638' })
    expect(locked.status).toBe(429)
    expect(locked.body.message).toMatch(/^Too many failed sign-ins for this device\./)
    // Another device of the shop is not locked by this one's failures.
    const { tablet: second } = await enrolled(s, 'Second tablet')
    expect((await second.post('/api/auth/pin', { userId: ops[3]!, pin: '7638' })).status).toBe(200)
  })

  it('refuses a PIN sign-in sent from another site (the same-origin check covers the new routes)', async () => {
    const { tablet } = await enrolled(shop, 'Tablet cross-site')
    const res = await tablet.post('/api/auth/pin', { userId: shop.ids.operator, pin: '2580' }, { origin: 'https://elsewhere.example' })
    expect(res.status).toBe(403)
    expect(res.body.message).toMatch(/another site/)
    const enrol = await tablet.post('/api/devices', { name: 'Forged' }, { origin: 'https://elsewhere.example' })
    expect(enrol.status).toBe(403)
  })
})
