// A role change counts at once, lists and figures never include another shop's rows, and the
// shop keeps an owner. Every route's 401, 403 and another shop's 404 are in routes.test.ts.
import { beforeAll, describe, expect, it } from 'vitest'
import { newLabelCode } from '../../shared/kerf/label-code'
import { appDb } from '../support/db'
import { makeShop, TEST_PASSWORD, type TestShop } from '../support/shops'

let a: TestShop
let b: TestShop

beforeAll(async () => {
  [a, b] = await Promise.all([makeShop('Alpha'), makeShop('Bravo')])
})

describe('a change of role', () => {
  it('a demoted person loses the role at once, whatever the cookie says', async () => {
    const shop = await makeShop('Demotion')
    expect((await shop.owner.patch(`/api/users/${shop.ids.crib}`, { role: 'operator' })).status).toBe(200)
    // The change of role ended the session; signed in again, the person has the new role.
    expect((await shop.crib.get('/api/me')).status).toBe(401)
    await shop.crib.login(shop.emails.crib, TEST_PASSWORD)
    const me = await shop.crib.get('/api/me')
    expect(me.body.role).toBe('operator')
    expect((await shop.crib.get('/api/cutters')).status).toBe(403)
    expect((await shop.owner.patch(`/api/users/${shop.ids.crib}`, { active: false })).status).toBe(200)
    expect((await shop.crib.get('/api/me')).status).toBe(401)
  })
})

describe('another shop\'s records', () => {
  it('never appear in lists', async () => {
    const users = await b.owner.get('/api/users')
    const emails = users.body.map((u: { email: string }) => u.email)
    expect(emails).toContain(b.emails.operator)
    expect(emails).not.toContain(a.emails.operator)
    const aMaterials = (await a.operator.get('/api/materials')).body.map((m: { id: number }) => m.id)
    const bMaterials = (await b.operator.get('/api/materials')).body.map((m: { id: number }) => m.id)
    expect(aMaterials.filter((id: number) => bMaterials.includes(id))).toEqual([])
  })

  it('do not count in the home figures', async () => {
    const db = appDb()
    try {
      const type = await db.insertInto('cutter_types').values({
        shop_id: a.id, name: 'Downcut 6 mm', profile: 'square_end', helix: 'downcut', flutes: 2, cutting_diameter_mm: 6.35,
        shank_diameter_mm: 6.35, cutting_length_mm: 22, overall_length_mm: 64, rated_life_minutes: 900,
        min_usable_diameter_mm: 6, unit_cost_cents: 3000,
      }).returning('id').executeTakeFirstOrThrow()
      await db.insertInto('cutters').values([
        { shop_id: a.id, type_id: type.id, code: newLabelCode(), diameter_mm: 6.35, life_used: 0.95 },
      ]).execute()
    } finally {
      await db.destroy()
    }
    const aDash = (await a.crib.get('/api/dashboard')).body
    const bDash = (await b.crib.get('/api/dashboard')).body
    expect(aDash.byStatus.in_crib).toBe(1)
    expect(aDash.due).toHaveLength(1)
    expect(aDash.due[0]).toMatchObject({ reason: 'life_used', action: 'resharpen' })
    expect(bDash.byStatus.in_crib).toBe(0)
    expect(bDash.due).toHaveLength(0)
  })
})

describe('the shop keeps an owner', () => {
  it('refuses to demote the last owner', async () => {
    const res = await a.owner.patch(`/api/users/${a.ids.owner}`, { role: 'operator' })
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/at least one owner/)
  })
})
