// Runs the migrations in migrations/ with Kysely's Migrator.
//   latest: everything pending · down: undo the last one · reset: undo them all
import { promises as fs } from 'node:fs'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { FileMigrationProvider, Migrator, NO_MIGRATIONS } from 'kysely'
import { connect } from '../server/db/connect'

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)))

export async function migrate(url: string, command: 'latest' | 'down' | 'reset'): Promise<void> {
  const db = connect(url, 2)
  const migrator = new Migrator({
    db,
    provider: new FileMigrationProvider({ fs, path, migrationFolder: path.join(root, 'migrations') }),
  })
  try {
    const { error, results } = command === 'latest'
      ? await migrator.migrateToLatest()
      : command === 'down'
        ? await migrator.migrateDown()
        : await migrator.migrateTo(NO_MIGRATIONS)
    for (const r of results ?? []) {
      console.log(`[migrate] ${r.direction === 'Up' ? 'applied' : 'reverted'} ${r.migrationName}: ${r.status}`)
    }
    if (error) throw error
    if (!results?.length) console.log('[migrate] nothing to do')
  } finally {
    await db.destroy()
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const command = (process.argv[2] ?? 'latest') as 'latest' | 'down' | 'reset'
  if (!['latest', 'down', 'reset'].includes(command)) {
    console.error('usage: migrate.ts latest | down | reset')
    process.exit(2)
  }
  const url = process.env.NUXT_DATABASE_URL || process.env.DATABASE_URL || ''
  migrate(url, command).catch((err) => {
    console.error('[migrate] failed:', err instanceof Error ? err.message : err)
    process.exit(1)
  })
}
