// A hot statement built and compiled by Kysely once, then run with new values each time. Building a
// query (parsing its column references, freezing its tree) and compiling it to text cost the app
// more CPU than anything else on the log-a-cut path but the socket: for the few statements every
// request or every log sends, that work is done on the first run and kept.
//
// The builder is handed stand-ins instead of values: each stand-in becomes a parameter of the
// compiled text, and each run puts the run's value in its place. So the builder must use its
// stand-ins only as values (in a comparison, a set, a select of a value), never to decide the
// shape of the query (`if`, `$if`, `??`, a spread): a query whose shape depends on a value is one
// reusable query per shape. The first run checks that every stand-in became a parameter.
import type { CompiledQuery, Compilable, QueryResult } from 'kysely'
import type { Db, Queryable } from './connect'

const STAND_IN = Symbol('stand-in')
interface StandIn { readonly [STAND_IN]: string }

function isStandIn(value: unknown): value is StandIn {
  return typeof value === 'object' && value !== null && STAND_IN in value
}

/**
 * A statement compiled once. `build(db, values)` builds it with a stand-in for each value it reads
 * (typed as the value); the returned function runs it with a run's values, on the root handle or
 * inside a transaction. Mark it PREPARED too, so PostgreSQL also parses and plans it once.
 */
export function reusableQuery<V extends object, R>(build: (db: Db, values: V) => Compilable<R>) {
  let compiled: CompiledQuery<R> | undefined
  let slots: Array<keyof V | undefined> = []
  return async function run(db: Queryable, values: V): Promise<QueryResult<R>> {
    if (!compiled) {
      const read = new Set<string>()
      const standIns = new Proxy({}, {
        get: (_, name) => {
          read.add(String(name))
          return { [STAND_IN]: String(name) }
        },
      }) as V
      const query = build(db as Db, standIns).compile()
      const found = query.parameters.map((p) => (isStandIn(p) ? p[STAND_IN] as keyof V & string : undefined))
      const unused = [...read].filter((name) => !found.includes(name as keyof V & string))
      if (unused.length) throw new Error(`reusableQuery: ${unused.join(', ')} did not become a parameter; use each value as a value only`)
      compiled = query
      slots = found
    }
    const parameters = compiled.parameters.map((p, i) => (slots[i] === undefined ? p : values[slots[i]!]))
    return db.executeQuery<R>({ ...compiled, parameters })
  }
}
