// The one database handle of this server process, built from runtime config.
import { connect, type Db, type Tx } from '../../db/connect'

let db: Db | undefined

export function useDb(): Db {
  if (!db) {
    const config = useRuntimeConfig()
    db = connect(config.databaseUrl, Number(config.databasePoolSize) || 20)
  }
  return db
}

/** Runs `fn` in one transaction: everything that changes two rows goes through here. */
export function transaction<T>(fn: (tx: Tx) => Promise<T>): Promise<T> {
  return useDb().transaction().execute(fn)
}

export async function closeDb(): Promise<void> {
  if (db) {
    const closing = db
    db = undefined
    await closing.destroy()
  }
}
