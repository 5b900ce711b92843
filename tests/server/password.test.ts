// Changing one's own password on the Account page: the current one is required.
import { describe, expect, it } from 'vitest'
import { Client } from '../support/http'
import { makeShop, TEST_PASSWORD } from '../support/shops'

describe('changing one\'s own password', () => {
  it('needs the current password; afterwards only the new one signs in', async () => {
    const shop = await makeShop('Password')
    const wrong = await shop.operator.post('/api/me/password', { currentPassword: 'not-the-password', newPassword: 'a-brand-new-password' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.fields.currentPassword).toMatch(/not your current password/)
    const short = await shop.operator.post('/api/me/password', { currentPassword: TEST_PASSWORD, newPassword: 'short' })
    expect(short.status).toBe(400)
    expect(short.body.data.fields.newPassword).toBeDefined()

    const res = await shop.operator.post('/api/me/password', { currentPassword: TEST_PASSWORD, newPassword: 'a-brand-new-password' })
    expect(res.status).toBe(200)
    // Still signed in after the change.
    expect((await shop.operator.get('/api/me')).status).toBe(200)
    const fresh = new Client()
    expect((await fresh.post('/api/auth/login', { email: shop.emails.operator, password: TEST_PASSWORD })).status).toBe(401)
    expect((await fresh.post('/api/auth/login', { email: shop.emails.operator, password: 'a-brand-new-password' })).status).toBe(200)
  })

  it('needs a session', async () => {
    expect((await new Client().post('/api/me/password', { currentPassword: 'x', newPassword: 'a-brand-new-password' })).status).toBe(401)
  })
})
