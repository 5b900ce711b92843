// `npm run bench:wear [runs]`: the learned-wear insight's two halves timed apart, in this process,
// on the volume shop of `npm run seed:volume` (the database named by NUXT_DATABASE_URL): reading
// its sharp lives (server/utils/insights/sharp-lives.ts) and fitting the wear model to them
// (shared/kerf/wear-model.ts), each run `runs` times (15) after two warm-ups; prints the medians
// and the fastest. `npm run bench:insights` times the whole route over HTTP.
import { connect } from '../server/db/connect'
import { readSharpLives } from '../server/utils/insights/sharp-lives'
import { fitWearModel } from '../shared/kerf/wear-model'

const RUNS = Number(process.argv[2] ?? 15)
/** The volume shop's owner (scripts/seed-volume.ts; importing it would run the seed). */
const VOLUME_OWNER = 'volume-owner@example.com'

async function main() {
  const db = connect(process.env.NUXT_DATABASE_URL || process.env.DATABASE_URL || '', 2)
  try {
    const owner = await db.selectFrom('users').select('shop_id').where('email', '=', VOLUME_OWNER).executeTakeFirst()
    if (!owner) throw new Error('no volume shop: run npm run seed:volume first')
    const shopId = owner.shop_id
    const materials = (await db.selectFrom('materials').select(['id', 'wear_factor']).where('shop_id', '=', shopId).orderBy('id').execute())
      .map((m) => ({ materialId: m.id, startingFactor: m.wear_factor }))
    // Every life the roll-up holds (the route's default range covers the seeded year).
    const range = { start: new Date('1970-01-01T00:00:00Z'), end: new Date('9999-01-01T00:00:00Z') }
    const read: number[] = [], fit: number[] = []
    let lives = await readSharpLives(db, shopId, range)
    let model = fitWearModel(lives, materials)
    for (let run = 0; run < RUNS + 2; run++) {
      const t0 = performance.now()
      lives = await readSharpLives(db, shopId, range)
      const t1 = performance.now()
      model = fitWearModel(lives, materials)
      const t2 = performance.now()
      if (run >= 2) { read.push(t1 - t0); fit.push(t2 - t1) }
    }
    const median = (xs: number[]) => { const s = [...xs].sort((a, b) => a - b); return (s[(s.length - 1) >> 1]! + s[s.length >> 1]!) / 2 }
    const line = (what: string, xs: number[]) => console.log(`${what.padEnd(28)} median ${median(xs).toFixed(0).padStart(4)} ms   fastest ${Math.min(...xs).toFixed(0).padStart(4)} ms`)
    console.log(`${lives.typeId.length} lives, ${lives.materialId.length} material entries, ${model.iterations} Newton iterations (converged: ${model.converged}), ${RUNS} runs`)
    line('reading the sharp lives', read)
    line('fitting the wear model', fit)
    line('both', read.map((r, i) => r + fit[i]!))
  } finally {
    await db.destroy()
  }
}

main().catch((err) => {
  console.error('[bench:wear] failed:', err instanceof Error ? err.message : err)
  process.exit(1)
})
