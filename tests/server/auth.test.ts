// Signing up, in and out, wrong passwords and throttling, against the running app.
import { randomUUID } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { Client } from '../support/http'

const PASSWORD = 'a-long-enough-password'
const email = () => `person-${randomUUID().slice(0, 8)}@example.com`

async function signUp(address = email()) {
  const client = new Client()
  const res = await client.post('/api/auth/signup', { shopName: 'Sawdust & Sons', name: 'Pat Doe', email: address, password: PASSWORD })
  return { client, res, address }
}

describe('sign-up', () => {
  it('creates the shop and signs its owner in', async () => {
    const { client, res, address } = await signUp()
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ email: address, role: 'owner', shop: { name: 'Sawdust & Sons' } })
    const me = await client.get('/api/me')
    expect(me.status).toBe(200)
    expect(me.body).toMatchObject({ id: res.body.id, name: 'Pat Doe', role: 'owner', shop: { id: res.body.shop.id } })
  })

  it('gives the new shop the common materials to start from', async () => {
    const { client } = await signUp()
    const materials = await client.get('/api/materials')
    expect(materials.body.map((m: { name: string }) => m.name)).toContain('HDPE')
    expect(materials.body.every((m: { wearFactor: number }) => m.wearFactor > 0)).toBe(true)
  })

  it('refuses an e-mail that already has an account', async () => {
    const { address } = await signUp()
    const again = await signUp(address)
    expect(again.res.status).toBe(409)
    expect(again.res.body.message).toMatch(/already exists/)
  })

  it('names the field that is wrong', async () => {
    const client = new Client()
    const res = await client.post('/api/auth/signup', { shopName: 'X', name: 'Y', email: 'not-an-address', password: 'short' })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(['email', 'password'])
    expect(res.body.message).toMatch(/email: enter a valid e-mail address/)
  })
})

describe('sign-in and sign-out', () => {
  it('signs in with the right password and out again', async () => {
    const { address } = await signUp()
    const client = new Client()
    const login = await client.post('/api/auth/login', { email: address.toUpperCase(), password: PASSWORD })
    expect(login.status).toBe(200)
    expect(login.headers.getSetCookie().join()).toMatch(/kerfbook-session=/)
    expect((await client.get('/api/me')).status).toBe(200)
    const logout = await client.post('/api/auth/logout')
    expect(logout.status).toBe(204)
    expect((await client.get('/api/me')).status).toBe(401)
  })

  it('answers 401 with a message for a wrong password, and the same for an unknown account', async () => {
    const { address } = await signUp()
    const wrong = await new Client().post('/api/auth/login', { email: address, password: 'not-the-password' })
    expect(wrong.status).toBe(401)
    expect(wrong.body.message).toBe('Wrong e-mail or password.')
    const unknown = await new Client().post('/api/auth/login', { email: email(), password: PASSWORD })
    expect(unknown.status).toBe(401)
    expect(unknown.body.message).toBe('Wrong e-mail or password.')
  })

  it('throttles an account after five failures, even with the right password, and says how long', async () => {
    const { address } = await signUp()
    const client = new Client({ 'x-forwarded-for': '198.51.100.20' })
    for (let i = 0; i < 5; i++) {
      expect((await client.post('/api/auth/login', { email: address, password: 'guess-number-' + i })).status).toBe(401)
    }
    const blocked = await client.post('/api/auth/login', { email: address, password: PASSWORD })
    expect(blocked.status).toBe(429)
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(blocked.body.message).toMatch(/Too many failed sign-ins for this account/)
  })

  it('throttles an address that tries many accounts', async () => {
    const client = new Client({ 'x-forwarded-for': '198.51.100.77' })
    for (let i = 0; i < 30; i++) {
      expect((await client.post('/api/auth/login', { email: email(), password: 'guess' })).status).toBe(401)
    }
    const { address } = await signUp()
    const blocked = await client.post('/api/auth/login', { email: address, password: PASSWORD })
    expect(blocked.status).toBe(429)
    expect(blocked.body.message).toMatch(/this network address/)
    // Another address is not affected.
    expect((await new Client({ 'x-forwarded-for': '198.51.100.78' }).post('/api/auth/login', { email: address, password: PASSWORD })).status).toBe(200)
  })

  it('a successful sign-in clears the account\'s earlier failures', async () => {
    const { address } = await signUp()
    const client = new Client({ 'x-forwarded-for': '198.51.100.30' })
    for (let i = 0; i < 4; i++) await client.post('/api/auth/login', { email: address, password: 'wrong-' + i })
    expect((await client.post('/api/auth/login', { email: address, password: PASSWORD })).status).toBe(200)
    for (let i = 0; i < 4; i++) await client.post('/api/auth/login', { email: address, password: 'wrong-again-' + i })
    expect((await client.post('/api/auth/login', { email: address, password: PASSWORD })).status).toBe(200)
  })
})
