// An invitation e-mail arrives at the mail catcher and its link lets the person in with the
// role they were given; a password reset works the same way.
import { describe, expect, it } from 'vitest'
import { Client, waitForMail } from '../support/http'
import { makeShop, TEST_PASSWORD } from '../support/shops'

const linkIn = (text: string, path: string) => {
  const match = text.match(new RegExp(`https?://\\S+${path}/([\\w-]+)`))
  if (!match) throw new Error(`no ${path} link in:\n${text}`)
  return { url: match[0], token: match[1]! }
}

describe('invitations', () => {
  it('e-mail a link that sets a password and signs the person in with their role', async () => {
    const shop = await makeShop('Invite')
    const invited = `new-crib-${shop.id}@example.com`
    const res = await shop.owner.post('/api/invitations', { email: invited, name: 'Robin Vale', role: 'crib_manager' })
    expect(res.status).toBe(201)

    const mail = await waitForMail(invited, 'invited')
    expect(mail.text).toContain('Test Owner has invited you')
    expect(mail.html).toContain('Choose a password')
    const { url, token } = linkIn(mail.text, '/invite')
    expect(url.startsWith(process.env.KERFBOOK_TEST_URL!)).toBe(true)

    // The page the link opens is served.
    const page = await fetch(url)
    expect(page.status).toBe(200)

    const newcomer = new Client()
    const info = await newcomer.get(`/api/invitations/${token}`)
    expect(info.body).toMatchObject({ email: invited, role: 'crib_manager', name: 'Robin Vale' })
    const accepted = await newcomer.post('/api/invitations/accept', { token, password: 'robins-own-password' })
    expect(accepted.status).toBe(200)
    expect(accepted.body).toMatchObject({ email: invited, role: 'crib_manager', shop: { id: shop.id } })
    expect((await newcomer.get('/api/me')).body.role).toBe('crib_manager')

    // The link works once; the person then signs in like anyone else.
    expect((await new Client().post('/api/invitations/accept', { token, password: 'someone-elses-try' })).status).toBe(404)
    await new Client().login(invited, 'robins-own-password')

    const people = await shop.owner.get('/api/users')
    expect(people.body.find((p: { email: string }) => p.email === invited)).toMatchObject({ status: 'active', role: 'crib_manager' })
  })

  it('refuse an address that has an account in another shop', async () => {
    const [one, two] = await Promise.all([makeShop('One'), makeShop('Two')])
    const res = await two.owner.post('/api/invitations', { email: one.emails.operator, name: 'Poacher', role: 'operator' })
    expect(res.status).toBe(409)
  })

  it('an unknown invitation link answers 404 with a way forward', async () => {
    const res = await new Client().get('/api/invitations/abcdefghijklmnopqrstuvwxyz012345')
    expect(res.status).toBe(404)
    expect(res.body.message).toMatch(/Ask the shop owner/)
  })
})

describe('password reset', () => {
  it('e-mails a one-hour link that sets a new password', async () => {
    const shop = await makeShop('Reset')
    const asked = await new Client().post('/api/auth/reset-request', { email: shop.emails.operator })
    expect(asked.status).toBe(202)
    const mail = await waitForMail(shop.emails.operator, 'Reset')
    const { token } = linkIn(mail.text, '/reset')

    const client = new Client()
    expect((await client.post('/api/auth/reset', { token, password: 'a-brand-new-password' })).status).toBe(200)
    expect((await client.get('/api/me')).body.email).toBe(shop.emails.operator)
    expect((await new Client().post('/api/auth/login', { email: shop.emails.operator, password: TEST_PASSWORD })).status).toBe(401)
    await new Client().login(shop.emails.operator, 'a-brand-new-password')
    expect((await new Client().post('/api/auth/reset', { token, password: 'yet-another-password' })).status).toBe(404)
  })

  it('answers the same for an unknown address and sends nothing', async () => {
    const res = await new Client().post('/api/auth/reset-request', { email: 'nobody-here@example.com' })
    expect(res.status).toBe(202)
    await expect(waitForMail('nobody-here@example.com', 'Reset', 500)).rejects.toThrow(/no mail/)
  })
})
