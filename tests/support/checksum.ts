// A fingerprint of everything one shop holds in the database: every row of every table with a
// shop_id column, the shop's own row, and the sign-in attempts of its people (by e-mail or by PIN). Taken before and
// after a run of requests, it shows whether any of them wrote. Scoped to the shop, so tests
// running at the same time against the same database do not disturb it.
import { sql } from 'kysely'
import type { Db } from '../../server/db/connect'

let tables: Promise<string[]> | undefined

/** The tables with a shop_id column, read from the catalogue so that a new table is covered at once. */
function shopTables(db: Db): Promise<string[]> {
  tables ??= sql<{ table_name: string }>`
    select table_name from information_schema.columns
    where table_schema = 'public' and column_name = 'shop_id'
      and table_name in (select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE')
    order by table_name`.execute(db).then((r) => r.rows.map((row) => row.table_name))
  return tables
}

/** One md5 per table (plus `shops` and `login_attempts`), each over the table's rows as text in a fixed order. */
export async function shopChecksum(db: Db, shopId: number): Promise<Record<string, string>> {
  const sums: Record<string, string> = {}
  for (const table of await shopTables(db)) {
    const { rows } = await sql<{ sum: string | null, n: number }>`
      select md5(string_agg(t::text, '|' order by t::text)) as sum, count(*)::int as n
      from ${sql.table(table)} t where t.shop_id = ${shopId}`.execute(db)
    sums[table] = `${rows[0]!.n}:${rows[0]!.sum ?? ''}`
  }
  const shop = await sql<{ sum: string | null }>`select md5(t::text) as sum from shops t where t.id = ${shopId}`.execute(db)
  sums.shops = shop.rows[0]?.sum ?? ''
  const attempts = await sql<{ sum: string | null, n: number }>`
    select md5(string_agg(a::text, '|' order by a::text)) as sum, count(*)::int as n from login_attempts a
    where lower(a.email) in (select lower(email) from users where shop_id = ${shopId})
       or a.email in (select 'pin:' || id from users where shop_id = ${shopId})`.execute(db)
  sums.login_attempts = `${attempts.rows[0]!.n}:${attempts.rows[0]!.sum ?? ''}`
  return sums
}

/** The tables whose rows differ between two checksums. */
export function changedTables(before: Record<string, string>, after: Record<string, string>): string[] {
  return [...new Set([...Object.keys(before), ...Object.keys(after)])].filter((t) => before[t] !== after[t]).sort()
}
