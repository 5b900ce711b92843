// Before the server tests and the browser journeys: a fresh database, migrated; the mail catcher;
// and the built app (.output) started against both. Tests reach them through the environment
// variables set here. Both projects (server, e2e) name this file; whichever runs first starts
// everything, and the last to finish stops it, so one run has one app, database and catcher.
import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync, rmSync } from 'node:fs'
import path from 'node:path'
import { startMailCatcher, type MailCatcher } from '../../scripts/mail-catcher'
import { freshDatabase, migrate, projectRoot } from './db'

// Ports may be moved so that two checkouts can run their tests side by side.
const APP_PORT = Number(process.env.KERFBOOK_TEST_APP_PORT ?? 3311)
const SMTP_PORT = Number(process.env.KERFBOOK_TEST_SMTP_PORT ?? 2626)
const MAIL_WEB_PORT = Number(process.env.KERFBOOK_TEST_MAIL_WEB_PORT ?? 2680)

const TASK_TOKEN = 'test-task-token-0123456789'

let server: ChildProcess | undefined
let catcher: MailCatcher | undefined

// Shared by the two projects' copies of this module (each project loads it on its own). The copy
// that started the app and the catcher holds them, so its `stop` is the one the last user calls.
const shared = globalThis as typeof globalThis & { kerfbookSetup?: { users: number, ready: Promise<void>, stop: () => Promise<void> } }

export async function setup() {
  if (shared.kerfbookSetup) {
    shared.kerfbookSetup.users++
    return shared.kerfbookSetup.ready
  }
  const ready = start()
  shared.kerfbookSetup = { users: 1, ready, stop }
  return ready
}

export async function teardown() {
  if (!shared.kerfbookSetup || --shared.kerfbookSetup.users > 0) return
  const { stop: stopStarted } = shared.kerfbookSetup
  shared.kerfbookSetup = undefined
  await stopStarted()
}

async function start() {
  process.env.KERFBOOK_TEST_ADMIN_URL ??= 'postgres://postgres@127.0.0.1:55433/postgres'
  const entry = path.join(projectRoot, '.output/server/index.mjs')
  if (!existsSync(entry)) throw new Error('No built app in .output: run the tests with `npm test`, which builds first.')

  const databaseUrl = await freshDatabase('kerfbook_test')
  await migrate(databaseUrl)
  catcher = await startMailCatcher({ smtpPort: SMTP_PORT, httpPort: MAIL_WEB_PORT })

  // Photos of a folder of their own, emptied each run: shop ids start again with the fresh
  // database, so files from an earlier run would otherwise seem to belong to today's shops.
  const uploadsDir = path.join(projectRoot, `.data/test-uploads-${APP_PORT}`)
  rmSync(uploadsDir, { recursive: true, force: true })

  const baseUrl = `http://127.0.0.1:${APP_PORT}`
  server = spawn(process.execPath, [entry], {
    cwd: projectRoot,
    env: {
      ...process.env,
      HOST: '127.0.0.1',
      PORT: String(APP_PORT),
      NUXT_DATABASE_URL: databaseUrl,
      NUXT_SESSION_PASSWORD: 'test-session-password-that-is-long-enough-0123456789',
      NUXT_SMTP_HOST: '127.0.0.1',
      NUXT_SMTP_PORT: String(SMTP_PORT),
      NUXT_SMTP_FROM: 'Kerfbook <kerfbook@example.com>',
      NUXT_PUBLIC_BASE_URL: baseUrl,
      // Lets the throttling tests speak for other addresses; nothing else sends the header.
      NUXT_TRUST_PROXY: 'true',
      NUXT_TASK_TOKEN: TASK_TOKEN,
      NUXT_UPLOADS_DIR: uploadsDir,
    },
    stdio: ['ignore', 'inherit', 'inherit'],
  })
  await waitFor(`${baseUrl}/api/me`)

  process.env.KERFBOOK_TEST_URL = baseUrl
  process.env.KERFBOOK_TEST_DATABASE_URL = databaseUrl
  process.env.KERFBOOK_TEST_MAIL_URL = `http://127.0.0.1:${MAIL_WEB_PORT}`
  process.env.KERFBOOK_TEST_TASK_TOKEN = TASK_TOKEN
  process.env.KERFBOOK_TEST_UPLOADS_DIR = uploadsDir
}

async function stop() {
  if (server && server.exitCode === null) {
    const exited = new Promise((resolve) => server!.once('exit', resolve))
    server.kill('SIGTERM')
    await exited
  }
  await catcher?.close()
}

async function waitFor(url: string, timeoutMs = 30_000) {
  const until = Date.now() + timeoutMs
  while (Date.now() < until) {
    if (server?.exitCode !== null) throw new Error(`The app under test exited with code ${server?.exitCode}`)
    try {
      await fetch(url)
      return
    } catch {
      await new Promise((r) => setTimeout(r, 150))
    }
  }
  throw new Error(`The app under test did not answer at ${url}`)
}
