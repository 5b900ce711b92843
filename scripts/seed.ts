// Builds the invented demo shop in the database named by NUXT_DATABASE_URL (or DATABASE_URL).
// Safe to run twice: the second run finds the shop and writes nothing.
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { connect } from '../server/db/connect'
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_SHOP, seedDemoShop } from '../server/db/seed/demo'
import { ROLE_LABELS } from '../shared/kerf/roles'

export async function seed(url: string): Promise<boolean> {
  const db = connect(url, 2)
  try {
    const { created } = await seedDemoShop(db)
    if (!created) {
      console.log('[seed] the demo shop is already there: nothing changed')
      return false
    }
    console.log(`[seed] created the demo shop "${DEMO_SHOP.name}"`)
    console.log(`[seed] sign in with any of these, password ${DEMO_PASSWORD}:`)
    for (const p of DEMO_PEOPLE) console.log(`[seed]   ${p.email.padEnd(24)} ${ROLE_LABELS[p.role]} (${p.name})`)
    return true
  } finally {
    await db.destroy()
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === path.resolve(process.argv[1])) {
  const url = process.env.NUXT_DATABASE_URL || process.env.DATABASE_URL || ''
  seed(url).catch((err) => {
    console.error('[seed] failed:', err instanceof Error ? err.message : err)
    process.exit(1)
  })
}
