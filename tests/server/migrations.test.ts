// The migrations go up and down on the real PostgreSQL, and the schema refuses impossible values.
import { sql } from 'kysely'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { connect, type Db } from '../../server/db/connect'
import { freshDatabase, migrate } from '../support/db'
import { down as dropChipLoads, up as addChipLoads } from '../../migrations/2026_12_04_0001_feeds'
import { down as machinesDown, up as machinesUp } from '../../migrations/2026_12_07_0001_machines'

const TABLES = ['shops', 'users', 'user_sessions', 'shop_mails', 'auth_tokens', 'login_attempts', 'machines', 'materials', 'suppliers', 'cutter_types',
  'purchase_orders', 'purchase_order_lines', 'cutters', 'uploads', 'cut_logs', 'cutter_events', 'regrind_batches',
  'regrind_batch_items', 'tooling_reports', 'chip_loads', 'cut_log_daily', 'cut_sharp_lives', 'cut_cleanup_daily', 'wear_factor_adoptions',
  'machine_tool_pockets', 'nc_programs', 'nc_runs', 'nc_run_logs', 'cut_log_changes', 'shop_devices']

let url: string
let db: Db

async function tables(): Promise<string[]> {
  const rows = await sql<{ table_name: string }>`
    select table_name from information_schema.tables
    where table_schema = 'public' and table_name not like 'kysely_%'`.execute(db)
  return rows.rows.map((r) => r.table_name).sort()
}

beforeAll(async () => {
  url = await freshDatabase('kerfbook_migrations_test')
  db = connect(url, 2)
})
afterAll(async () => {
  await db?.destroy()
})

describe('migrations', () => {
  it('create every table of the product, and take them all away again', async () => {
    await migrate(url, 'latest')
    expect(await tables()).toEqual([...TABLES].sort())
    await migrate(url, 'reset')
    expect(await tables()).toEqual([])
    await migrate(url, 'latest')
    expect(await tables()).toEqual([...TABLES].sort())
  })

  it('a second run has nothing to do', async () => {
    expect(await migrate(url, 'latest')).toContain('nothing to do')
  })
})

describe('the schema refuses impossible values', () => {
  let shopId: number
  let typeId: number
  let cutterId: number
  let materialId: number

  beforeAll(async () => {
    shopId = (await db.insertInto('shops').values({ name: 'Schema shop' }).returning('id').executeTakeFirstOrThrow()).id
    materialId = (await db.insertInto('materials').values({ shop_id: shopId, name: 'MDF', family: 'sheet_goods', wear_factor: 1 })
      .returning('id').executeTakeFirstOrThrow()).id
    typeId = (await db.insertInto('cutter_types').values({
      shop_id: shopId, name: 'Upcut 6 mm', profile: 'square_end', helix: 'upcut', flutes: 2, cutting_diameter_mm: 6.35,
      shank_diameter_mm: 6.35, cutting_length_mm: 22, overall_length_mm: 64, rated_life_minutes: 900,
      min_usable_diameter_mm: 6, unit_cost_cents: 3000,
    }).returning('id').executeTakeFirstOrThrow()).id
    cutterId = (await db.insertInto('cutters').values({ shop_id: shopId, type_id: typeId, code: 'ABCD234', diameter_mm: 6.35 })
      .returning('id').executeTakeFirstOrThrow()).id
  })

  const cutLog = (minutes: number, key: string) => db.insertInto('cut_logs').values({
    shop_id: shopId, cutter_id: cutterId, material_id: materialId, minutes, wear_factor: 1, life_added: 0.01,
    outcome: 'clean', idempotency_key: key,
  }).execute()

  it('a cut of zero or negative minutes', async () => {
    await expect(cutLog(0, 'key-zero-minutes')).rejects.toThrow(/check constraint/)
    await expect(cutLog(-5, 'key-negative-minutes')).rejects.toThrow(/check constraint/)
    await expect(cutLog(12.5, 'key-good-minutes')).resolves.toBeDefined()
  })

  it('a diameter of zero or less', async () => {
    await expect(db.insertInto('cutters').values({ shop_id: shopId, type_id: typeId, code: 'ABCD235', diameter_mm: 0 }).execute())
      .rejects.toThrow(/check constraint/)
  })

  it('an unknown status, and a cutter in a spindle without a machine', async () => {
    await expect(db.updateTable('cutters').set({ status: 'borrowed' as never }).where('id', '=', cutterId).execute())
      .rejects.toThrow(/check constraint/)
    await expect(db.updateTable('cutters').set({ status: 'in_spindle' }).where('id', '=', cutterId).execute())
      .rejects.toThrow(/check constraint/)
  })

  it('a label code with look-alike characters', async () => {
    await expect(db.insertInto('cutters').values({ shop_id: shopId, type_id: typeId, code: 'AB0O1IL', diameter_mm: 6 }).execute())
      .rejects.toThrow(/check constraint/)
  })

  it('the same idempotency key twice in a shop', async () => {
    await expect(cutLog(3, 'key-good-minutes')).rejects.toThrow(/duplicate key/)
  })

  it('a row that points at another shop\'s cutter type', async () => {
    const other = (await db.insertInto('shops').values({ name: 'Other shop' }).returning('id').executeTakeFirstOrThrow()).id
    await expect(db.insertInto('cutters').values({ shop_id: other, type_id: typeId, code: 'ABCD236', diameter_mm: 6 }).execute())
      .rejects.toThrow(/foreign key/)
  })
})

describe('the chip-load table', () => {
  it('is seeded for every shop that exists when it is added', async () => {
    const shops = await db.selectFrom('shops').select('id').execute()
    expect(shops.length).toBeGreaterThanOrEqual(2)
    // Its own down and up, called directly, so that a later migration does not change what is undone.
    await dropChipLoads(db)
    expect(await tables()).not.toContain('chip_loads')
    await addChipLoads(db)
    for (const s of shops) {
      const rows = await db.selectFrom('chip_loads').select(['family', 'source']).where('shop_id', '=', s.id).execute()
      expect(rows).toHaveLength(21)
      expect(new Set(rows.map((r) => r.family)).size).toBe(7)
    }
  })

  it('refuses a range whose smallest chip load is above its largest, and a second row for one band', async () => {
    const shopId = (await db.selectFrom('shops').select('id').orderBy('id').executeTakeFirstOrThrow()).id
    const row = { shop_id: shopId, family: 'wood' as const, diameter_min_mm: 20, diameter_max_mm: 30, chip_load_min_mm: 0.2, chip_load_max_mm: 0.1, source: 'test' }
    await expect(db.insertInto('chip_loads').values(row).execute()).rejects.toThrow(/check constraint/)
    await expect(db.insertInto('chip_loads').values({ ...row, diameter_min_mm: 0, chip_load_max_mm: 0.3 }).execute()).rejects.toThrow(/duplicate key/)
  })
})

describe('machines count pockets instead of a yes/no tool changer', () => {
  it('a changer becomes 8 pockets and a manual collet 0, and back; names differing only in case get a suffix', async () => {
    const shopId = (await db.insertInto('shops').values({ name: 'Pocket shop' }).returning('id').executeTakeFirstOrThrow()).id
    await db.insertInto('machines').values([
      { shop_id: shopId, name: 'Changer', min_rpm: 6000, max_rpm: 24000, pockets: 8 },
      { shop_id: shopId, name: 'Collet', min_rpm: 8000, max_rpm: 24000, pockets: 0 },
    ]).execute()
    // Their own down and up, called directly, so that a later migration does not change what is undone.
    await machinesDown(db)
    const old = await sql<{ name: string, tool_changer: boolean }>`select name, tool_changer from machines where shop_id = ${shopId} order by name`.execute(db)
    expect(old.rows).toEqual([{ name: 'Changer', tool_changer: true }, { name: 'Collet', tool_changer: false }])
    await sql`insert into machines (shop_id, name, min_rpm, max_rpm) values (${shopId}, 'COLLET', 500, 500)`.execute(db)
    await machinesUp(db)
    const rows = await db.selectFrom('machines').select(['name', 'pockets', 'min_rpm', 'max_rpm']).where('shop_id', '=', shopId).orderBy('id').execute()
    expect(rows).toEqual([
      { name: 'Changer', pockets: 8, min_rpm: 6000, max_rpm: 24000 },
      { name: 'Collet', pockets: 0, min_rpm: 8000, max_rpm: 24000 },
      // Brought inside the 1,000 to 100,000 rpm rule, min below max.
      { name: 'COLLET (2)', pockets: 0, min_rpm: 1000, max_rpm: 1001 },
    ])
    await expect(db.insertInto('machines').values({ shop_id: shopId, name: 'changer', min_rpm: 6000, max_rpm: 24000 }).execute()).rejects.toThrow(/duplicate key/)
    await expect(db.insertInto('machines').values({ shop_id: shopId, name: 'Fast', min_rpm: 6000, max_rpm: 24000, pockets: 100 }).execute()).rejects.toThrow(/check constraint/)
    await expect(db.insertInto('machines').values({ shop_id: shopId, name: 'Slow', min_rpm: 999, max_rpm: 24000 }).execute()).rejects.toThrow(/check constraint/)
  })
})
