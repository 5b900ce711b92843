// Makes a shop with one person in each role, signed in, for a test. The owner signs up
// through the API (its address marked confirmed); the others are written straight into the
// database with a real hash.
import { randomUUID } from 'node:crypto'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { appDb } from './db'
import { Client } from './http'

export const TEST_PASSWORD = 'correct-horse-battery'
let hashed: Promise<string> | undefined

export interface TestShop {
  id: number
  owner: Client
  crib: Client
  operator: Client
  emails: { owner: string, crib: string, operator: string }
  ids: { owner: number, crib: number, operator: number }
}

export async function makeShop(label = 'Test'): Promise<TestShop> {
  const tag = randomUUID().slice(0, 8)
  const emails = {
    owner: `owner-${tag}@example.com`,
    crib: `crib-${tag}@example.com`,
    operator: `operator-${tag}@example.com`,
  }
  const owner = new Client()
  const signup = await owner.post('/api/auth/signup', { shopName: `${label} shop ${tag}`, name: 'Test Owner', email: emails.owner, password: TEST_PASSWORD })
  if (signup.status !== 201) throw new Error(`sign-up answered ${signup.status}: ${JSON.stringify(signup.body)}`)
  const shopId = signup.body.shop.id as number

  hashed ??= new Hash(new Scrypt({})).make(TEST_PASSWORD)
  const hash = await hashed
  const db = appDb()
  try {
    // The owner's address counts as confirmed, so the shop may send mail; confirming through the
    // e-mail itself is tested in tests/server/security.test.ts.
    await db.updateTable('users').set({ email_confirmed_at: new Date() }).where('id', '=', signup.body.id).execute()
    const rows = await db.insertInto('users').values([
      { shop_id: shopId, email: emails.crib, name: 'Test Crib', role: 'crib_manager', password_hash: hash },
      { shop_id: shopId, email: emails.operator, name: 'Test Operator', role: 'operator', password_hash: hash },
    ]).returning(['id', 'role']).execute()
    const crib = new Client()
    const operator = new Client()
    await crib.login(emails.crib, TEST_PASSWORD)
    await operator.login(emails.operator, TEST_PASSWORD)
    return {
      id: shopId, owner, crib, operator, emails,
      ids: { owner: signup.body.id, crib: rows.find((r) => r.role === 'crib_manager')!.id, operator: rows.find((r) => r.role === 'operator')!.id },
    }
  } finally {
    await db.destroy()
  }
}
