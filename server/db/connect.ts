// Builds a Kysely instance on a pg pool. Shared by the Nitro server and the scripts (migrate, seed).
import { Kysely, PostgresDialect, type Transaction } from 'kysely'
import pg from 'pg'
import type { Database } from './schema'

// numeric and bigint arrive as strings by default; our numerics are small enough for doubles,
// and bigint counts/ids stay below 2^53.
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => Number.parseFloat(v))
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number.parseInt(v, 10))
// Dates (calendar days) stay as 'YYYY-MM-DD' text instead of shifting through a local midnight.
pg.types.setTypeParser(pg.types.builtins.DATE, (v) => v)

export type Db = Kysely<Database>
export type Tx = Transaction<Database>
/** Either the root handle or an open transaction: query functions accept both. */
export type Queryable = Db | Tx

export function connect(connectionString: string, max = 10): Db {
  if (!connectionString) {
    throw new Error('No database URL: set NUXT_DATABASE_URL (for example postgres://postgres@127.0.0.1:55432/kerfbook).')
  }
  return new Kysely<Database>({
    dialect: new PostgresDialect({ pool: new pg.Pool({ connectionString, max }) }),
  })
}
