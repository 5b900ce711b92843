// reusableQuery: a hot statement built and compiled once, each run sending its own values.
import { DummyDriver, Kysely, PostgresAdapter, PostgresIntrospector, PostgresQueryCompiler, sql, type CompiledQuery, type DatabaseConnection } from 'kysely'
import { describe, expect, it } from 'vitest'
import { reusableQuery } from '../../server/db/reusable'

/** A Kysely that sends nothing anywhere and keeps what it was asked to run. */
function recordingDb() {
  const sent: CompiledQuery[] = []
  class Recording extends DummyDriver {
    override async acquireConnection(): Promise<DatabaseConnection> {
      return {
        executeQuery: async (query) => { sent.push(query); return { rows: [] } },
        // eslint-disable-next-line require-yield
        streamQuery: async function* () { throw new Error('not used') },
      }
    }
  }
  const db = new Kysely<{ cutters: { id: number, shop_id: number, code: string } }>({
    dialect: {
      createAdapter: () => new PostgresAdapter(),
      createDriver: () => new Recording(),
      createIntrospector: (k) => new PostgresIntrospector(k),
      createQueryCompiler: () => new PostgresQueryCompiler(),
    },
  })
  return { db, sent }
}

describe('a reusable query', () => {
  it('is built once and sends each run\'s own values in their places', async () => {
    const { db, sent } = recordingDb()
    let builds = 0
    const byCode = reusableQuery((k, v: { shopId: number, code: string }) => {
      builds++
      return (k as unknown as typeof db).selectFrom('cutters').select('id').where('shop_id', '=', v.shopId).where('code', '=', v.code).limit(sql.lit(1))
    })
    await byCode(db as never, { shopId: 3, code: 'K7Q2M9P' })
    await byCode(db as never, { shopId: 8, code: 'H3N8X2R' })
    expect(builds).toBe(1)
    expect(sent.map((q) => q.sql)).toEqual([sent[0]!.sql, sent[0]!.sql])
    expect(sent[0]!.sql).toBe('select "id" from "cutters" where "shop_id" = $1 and "code" = $2 limit 1')
    expect(sent.map((q) => q.parameters)).toEqual([[3, 'K7Q2M9P'], [8, 'H3N8X2R']])
  })

  it('refuses a builder that does not send a value as a value', async () => {
    const { db } = recordingDb()
    // The code is written into the text: every later run would send the first run's code.
    const wrong = reusableQuery((k, v: { shopId: number, code: string }) =>
      (k as unknown as typeof db).selectFrom('cutters').select('id').where('shop_id', '=', v.shopId).where('code', '=', sql.lit(String(v.code))))
    await expect(wrong(db as never, { shopId: 3, code: 'K7Q2M9P' })).rejects.toThrow(/code did not become a parameter/)
  })
})
