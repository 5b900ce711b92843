// The demo shop seed (`npm run db:seed`): builds a consistent shop once, and only once.
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { sql } from 'kysely'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import jstat from 'jstat'
import { connect, type Db } from '../../server/db/connect'
import { reorderRows } from '../../server/utils/crib/reorder'
import { gettingReady } from '../../server/utils/platform/getting-ready'
import { stockInsight } from '../../server/utils/insights/stock'
import { freshDatabase, migrate, runScript } from '../support/db'

const SHOP = 'Millrace Signs & Displays'

/** Row counts of every table plus a few sums that move if any row is rewritten. */
async function fingerprint(db: Db) {
  const tables = await sql<{ name: string }>`
    select table_name as name from information_schema.tables
    where table_schema = 'public' and table_type = 'BASE TABLE' order by table_name
  `.execute(db)
  const counts: Record<string, number> = {}
  for (const { name } of tables.rows) {
    const r = await sql<{ n: number }>`select count(*)::int as n from ${sql.table(name)}`.execute(db)
    counts[name] = r.rows[0]!.n
  }
  const sums = await sql`
    select (select sum(life_used)::text from cutters) as life_used,
           (select sum(minutes_total)::text from cutters) as minutes_total,
           (select max(updated_at)::text from cutters) as last_update,
           (select sum(life_added)::text from cut_logs) as life_added,
           (select max(id)::text from cutter_events) as last_event
  `.execute(db)
  return { counts, sums: sums.rows[0] }
}

describe('the demo shop seed', () => {
  let db: Db
  let firstRun: string
  let secondRun: string
  let before: Awaited<ReturnType<typeof fingerprint>>
  let after: Awaited<ReturnType<typeof fingerprint>>

  beforeAll(async () => {
    const url = await freshDatabase('kerfbook_seed_test')
    await migrate(url)
    db = connect(url, 2)
    firstRun = await runScript('seed.ts', [], url)
    before = await fingerprint(db)
    secondRun = await runScript('seed.ts', [], url)
    after = await fingerprint(db)
  }, 60_000)

  afterAll(async () => {
    await db?.destroy()
  })

  it('creates the shop on the first run and says how to sign in', () => {
    expect(firstRun).toContain(`[seed] created the demo shop "${SHOP}"`)
    expect(firstRun).toContain('owner@example.com')
    expect(before.counts.cut_logs).toBeGreaterThan(1000)
  })

  it('changes nothing when run a second time', () => {
    expect(secondRun).toContain('[seed] the demo shop is already there: nothing changed')
    expect(after).toEqual(before)
    expect(after.counts.shops).toBe(1)
  })

  it('reorders its router bits as the slow movers they are: Poisson reorder points in whole cutters, in plain words', async () => {
    const { jStat } = jstat
    const shop = await db.selectFrom('shops').select('id').where('name', '=', SHOP).executeTakeFirstOrThrow()
    const rows = await reorderRows(db, shop.id)
    expect(rows.length).toBeGreaterThan(3)
    for (const r of rows) {
      expect(Number.isInteger(r.reorderPoint) && Number.isInteger(r.suggestedQty), r.typeName).toBe(true)
      expect(r.explanation.length, r.typeName).toBeGreaterThan(20)
      if (r.method !== 'poisson') continue
      // The smallest s with P(D ≤ s) ≥ the service level, found again from jStat's Poisson distribution.
      let s = 0
      while (r.leadTimeDemand > 0 && jStat.poisson.cdf(s, r.leadTimeDemand) < r.serviceLevel) s++
      expect(r.reorderPoint, r.typeName).toBe(s)
    }
    // Every demo type is used at most a few times a month: all are decided by Poisson demand.
    expect(rows.every((r) => r.method === 'poisson')).toBe(true)
    const stock = await stockInsight(db, shop.id)
    for (const r of stock.rows) expect(r.tiedUpCents).toBe(r.inStock * r.unitCostCents)
  })

  it('has done every getting-ready step, so Home shows its owner no list', async () => {
    const shop = await db.selectFrom('shops').select('id').where('name', '=', SHOP).executeTakeFirstOrThrow()
    const ready = await gettingReady(db, shop.id, 'owner')
    expect(ready.steps.filter((s) => !s.done).map((s) => s.key)).toEqual([])
    expect(ready.done).toBe(true)
  })

  it('has cutters in every status', async () => {
    const rows = await db.selectFrom('cutters').select('status').distinct().execute()
    expect(rows.map((r) => r.status).sort()).toEqual(['at_regrind', 'in_crib', 'in_spindle', 'lost', 'retired'])
  })

  it('retires broken cutters with a broken cut on record', async () => {
    const broken = await db.selectFrom('cutters').select('id').where('retired_reason', '=', 'broken').execute()
    expect(broken.length).toBeGreaterThanOrEqual(2)
    const logged = await db.selectFrom('cut_logs').select('cutter_id').distinct()
      .where('outcome', '=', 'broken').where('cutter_id', 'in', broken.map((c) => c.id)).execute()
    expect(logged.length).toBe(broken.length)
  })

  it("tells each cutter's story in events that end in its status, with every cut made while it was loaded", async () => {
    const cutters = await db.selectFrom('cutters').select(['id', 'code', 'status', 'machine_id']).execute()
    const events = await db.selectFrom('cutter_events').select(['cutter_id', 'kind', 'from_status', 'to_status', 'machine_id', 'created_at'])
      .orderBy('created_at').orderBy('id').execute()
    const cuts = await db.selectFrom('cut_logs').select(['cutter_id', 'machine_id', 'cut_at']).orderBy('cut_at').execute()
    for (const c of cutters) {
      const story = events.filter((e) => e.cutter_id === c.id && e.to_status)
      expect(story[0]?.kind, c.code).toBe('received')
      let status: string | null = null
      for (const e of story) {
        expect(e.from_status, `${c.code} ${e.kind}`).toBe(status)
        status = e.to_status
      }
      expect(status, c.code).toBe(c.status)
      for (const cut of cuts.filter((l) => l.cutter_id === c.id)) {
        const last = story.filter((e) => e.created_at <= cut.cut_at).at(-1)
        expect(last?.kind, `${c.code} at ${cut.cut_at.toISOString()}`).toBe('loaded')
        expect(last?.machine_id).toBe(cut.machine_id)
      }
    }
  })

  // Palmgren–Miner linear damage accumulation: life used is the sum of each cut's
  // minutes × wear factor / (rated life × life scale) over the current sharp life only.
  it("keeps every cutter's life used and minutes equal to the sums of its cut logs", async () => {
    const rows = await sql<{ code: string, life_used: number, minutes_this_life: number, minutes_total: number, life_sum: number, this_life_minutes: number, all_minutes: number }>`
      select c.code, c.life_used, c.minutes_this_life, c.minutes_total,
             coalesce(sum(l.life_added) filter (where l.regrind_count = c.regrind_count), 0)::float8 as life_sum,
             coalesce(sum(l.minutes) filter (where l.regrind_count = c.regrind_count), 0)::float8 as this_life_minutes,
             coalesce(sum(l.minutes), 0)::float8 as all_minutes
      from cutters c left join cut_logs l on l.cutter_id = c.id
      group by c.id
    `.execute(db)
    expect(rows.rows.length).toBeGreaterThanOrEqual(60)
    for (const r of rows.rows) {
      expect(Math.abs(r.life_used - r.life_sum), `life used of ${r.code}`).toBeLessThan(1e-6)
      expect(Math.abs(r.minutes_this_life - r.this_life_minutes), `minutes this life of ${r.code}`).toBeLessThan(1e-6)
      expect(Math.abs(r.minutes_total - r.all_minutes), `minutes in total of ${r.code}`).toBeLessThan(1e-6)
    }
  })

  it('lets the demo people sign in with the demo password', async () => {
    const users = await db.selectFrom('users').select(['email', 'role', 'password_hash']).orderBy('email').execute()
    const roles = Object.fromEntries(users.map((u) => [u.email, u.role]))
    expect(roles).toMatchObject({ 'owner@example.com': 'owner', 'crib@example.com': 'crib_manager', 'operator@example.com': 'operator' })
    const hash = new Hash(new Scrypt({}))
    for (const email of ['owner@example.com', 'crib@example.com', 'operator@example.com']) {
      const user = users.find((u) => u.email === email)!
      expect(await hash.verify(user.password_hash!, 'kerfbook-demo'), email).toBe(true)
    }
  })
})
