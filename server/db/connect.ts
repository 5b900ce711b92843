// Builds a Kysely instance on a pg pool. Shared by the Nitro server and the scripts (migrate, seed).
import { createHash } from 'node:crypto'
import { Kysely, PostgresDialect, sql, type Transaction } from 'kysely'
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
  // A connection attempt gives up after 5 s, so a database that does not answer fails the
  // request (503, see server/plugins/db.ts) instead of holding it open.
  const pool = new pg.Pool({ connectionString, max, connectionTimeoutMillis: 5000 })
  // When PostgreSQL restarts or drops a connection, the client emits 'error'; Node ends the
  // process on an 'error' event nobody listens to. Idle clients report through the pool, busy
  // ones through themselves (their query fails too, and the pool discards them on release).
  pool.on('error', (err) => warnDropped(err))
  pool.on('connect', (client) => {
    client.on('error', (err) => warnDropped(err))
    prepareMarked(client)
  })
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) })
}

const PREPARE_MARK = '/* prepared */'
/**
 * Ends a query whose text never varies (`.modifyEnd(PREPARED)`) so that each connection parses and
 * plans it once and then only executes it. For the few hot statements (logging a cut): an ordinary
 * query is parsed and planned on every execution, which was half of PostgreSQL's work for a log.
 * Mark only statements that select named columns, so that a migration never changes their result.
 */
export const PREPARED = sql.raw(PREPARE_MARK)

const statementNames = new Map<string, string>()
function prepareMarked(client: pg.PoolClient) {
  const query = client.query as (...args: unknown[]) => unknown
  client.query = function (this: pg.PoolClient, ...args: unknown[]) {
    const [text, values] = args
    if (args.length === 2 && typeof text === 'string' && text.endsWith(PREPARE_MARK) && Array.isArray(values)) {
      let name = statementNames.get(text)
      if (!name) {
        name = `kerf_${createHash('sha1').update(text).digest('hex').slice(0, 20)}`
        statementNames.set(text, name)
      }
      return query.call(this, { name, text, values })
    }
    return query.apply(this, args)
  } as typeof client.query
}

let lastWarning = 0
function warnDropped(err: Error) {
  // One line every few seconds is enough when a restart drops every connection at once.
  if (Date.now() - lastWarning < 5000) return
  lastWarning = Date.now()
  console.warn(`[db] a database connection was lost and will be replaced: ${err.message}`)
}

/** SQLSTATEs and socket errors that mean the database cannot be reached now, rather than a bad query. */
const UNAVAILABLE_CODES = new Set(['57P01', '57P02', '57P03', '53300', 'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND', 'EAI_AGAIN'])
const UNAVAILABLE_MESSAGES = /^(Connection terminated|timeout exceeded when trying to connect|Client has encountered a connection error|Client was closed|Connection ended)/

/** True when an error (or its cause) says the database is down, restarting or unreachable. */
export function isDatabaseUnavailable(err: unknown): boolean {
  for (let e = err, depth = 0; e && typeof e === 'object' && depth < 5; e = (e as { cause?: unknown }).cause, depth++) {
    const { code, message } = e as { code?: unknown, message?: unknown }
    if (typeof code === 'string' && (UNAVAILABLE_CODES.has(code) || code.startsWith('08'))) return true
    if (typeof message === 'string' && UNAVAILABLE_MESSAGES.test(message)) return true
    // Several addresses tried at once (localhost as ::1 and 127.0.0.1) fail together.
    if (e instanceof AggregateError && e.errors.some((inner) => isDatabaseUnavailable(inner))) return true
  }
  return false
}
