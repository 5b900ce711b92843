// Database helpers for tests: every test run works on the real PostgreSQL that `npm test` started.
import { execFile } from 'node:child_process'
import path from 'node:path'
import { promisify } from 'node:util'
import pg from 'pg'
import { connect, type Db } from '../../server/db/connect'

const run = promisify(execFile)
export const projectRoot = path.resolve(import.meta.dirname, '../..')

/** The maintenance database URL (postgres), from which test databases are made. */
export function adminUrl(): string {
  const url = process.env.KERFBOOK_TEST_ADMIN_URL
  if (!url) throw new Error('KERFBOOK_TEST_ADMIN_URL is not set: run the tests through `npm test`.')
  return url
}

export function databaseUrl(name: string): string {
  const url = new URL(adminUrl())
  url.pathname = `/${name}`
  return url.toString()
}

/** Drops and creates an empty database; returns its URL. */
export async function freshDatabase(name: string): Promise<string> {
  if (!/^[a-z0-9_]+$/.test(name)) throw new Error(`bad database name ${name}`)
  const client = new pg.Client({ connectionString: adminUrl() })
  await client.connect()
  try {
    await client.query(`drop database if exists "${name}" with (force)`)
    await client.query(`create database "${name}"`)
  } finally {
    await client.end()
  }
  return databaseUrl(name)
}

/** Runs a project script (scripts/<file>) as a child process against a database, as npm does. */
export async function runScript(file: string, args: string[], url: string): Promise<string> {
  const { stdout } = await run(process.execPath, ['--import', 'tsx', path.join(projectRoot, 'scripts', file), ...args], {
    cwd: projectRoot,
    env: { ...process.env, NUXT_DATABASE_URL: url },
    timeout: 120_000,
  })
  return stdout
}

export function migrate(url: string, command: 'latest' | 'down' | 'reset' = 'latest'): Promise<string> {
  return runScript('migrate.ts', [command], url)
}

/** The database the app under test uses (made fresh by the global setup). */
export function appDb(): Db {
  const url = process.env.KERFBOOK_TEST_DATABASE_URL
  if (!url) throw new Error('KERFBOOK_TEST_DATABASE_URL is not set: run the tests through `npm test`.')
  return connect(url, 4)
}

/** Runs `fn` with a handle on the app's database, closed afterwards. */
export async function withDb<T>(fn: (db: Db) => Promise<T>): Promise<T> {
  const db = appDb()
  try {
    return await fn(db)
  } finally {
    await db.destroy()
  }
}
