// `npm run seed:volume [count]`: a separate invented shop with one million cut logs (or
// `count`) in the database named by NUXT_DATABASE_URL, for timing the insights at size. The
// logs come from one generate_series INSERT in replica mode (no triggers), then one rebuild
// of the roll-ups, all in one transaction; it needs a superuser, as on a scratch cluster.
// Sign in as volume-owner@example.com / kerfbook-demo.
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import { sql } from 'kysely'
import { connect } from '../server/db/connect'
import { STARTING_MATERIALS } from '../shared/kerf/materials'

const COUNT = Number(process.argv[2] ?? 1_000_000)
const CUTTERS = 10_000
const LOGS_PER_LIFE = 34 // so each cutter's logs fill three lives: new and two regrinds
export const VOLUME_OWNER = 'volume-owner@example.com'

async function main() {
  const url = process.env.NUXT_DATABASE_URL || process.env.DATABASE_URL || ''
  if (!(COUNT > 0 && COUNT <= 20_000_000)) throw new Error('count must be between 1 and 20000000')
  const db = connect(url, 2)
  const started = Date.now()
  try {
    const shopId = await db.transaction().execute(async (tx) => {
      const shop = await tx.insertInto('shops').values({ name: `Volume test shop ${new Date().toISOString()}` }).returning('id').executeTakeFirstOrThrow()
      const hash = await new Hash(new Scrypt({})).make('kerfbook-demo')
      await tx.deleteFrom('users').where('email', '=', VOLUME_OWNER).execute()
      const people = await tx.insertInto('users').values([
        { shop_id: shop.id, email: VOLUME_OWNER, name: 'Volume Owner', role: 'owner', password_hash: hash },
        ...[1, 2, 3].map((n) => ({ shop_id: shop.id, email: `volume-op${n}-${shop.id}@example.com`, name: `Volume Operator ${n}`, role: 'operator' as const, password_hash: hash })),
      ]).returning('id').execute()
      const machines = await tx.insertInto('machines').values(['Volume table A', 'Volume table B', 'Volume desktop'].map((name) => ({
        shop_id: shop.id, name, min_rpm: 6000, max_rpm: 24000,
      }))).returning('id').execute()
      await tx.insertInto('materials').values(STARTING_MATERIALS.map((m) => ({
        shop_id: shop.id, name: m.name, family: m.family, wear_factor: m.wearFactor, common: m.common,
      }))).execute()
      await tx.insertInto('cutter_types').values([600, 750, 900, 1050, 1200, 1500].map((rated, i) => ({
        shop_id: shop.id, name: `Volume type ${i + 1}`, profile: (['square_end', 'o_flute', 'ball_nose'] as const)[i % 3]!, helix: 'upcut',
        flutes: 1 + (i % 2), cutting_diameter_mm: 6.35, shank_diameter_mm: 6.35, cutting_length_mm: 22, overall_length_mm: 64,
        rated_life_minutes: rated, min_usable_diameter_mm: 6, unit_cost_cents: 2500 + 500 * i, regrind_cost_cents: 900,
      }))).execute()
      // Cutters on their third life after two regrinds, the first two ended by wear. The third
      // ended by wear for half of them (retired worn out or undersize); the rest are censored
      // there: still cutting (back in the crib), broken or lost.
      await sql`
        insert into cutters (shop_id, type_id, code, status, diameter_mm, regrind_count, life_scale, retired_reason, flagged, received_at)
        select ${shop.id}, t.ids[1 + g % array_length(t.ids, 1)],
          -- Label codes from the shop's id and the cutter's number in hex, spelled with label letters.
          'V' || translate(lpad(upper(to_hex(${shop.id}::int)), 3, '0') || lpad(upper(to_hex(g)), 5, '0'), '0123456789ABCDEF', 'ABCDEFGHJKMNPQRS'),
          (array['retired', 'retired', 'retired', 'in_crib', 'in_crib', 'retired', 'lost', 'retired', 'retired', 'in_crib'])[1 + (g / 7) % 10]::text,
          6.0, 2, 0.8,
          (array['worn', 'worn', 'undersize', null, null, 'broken', null, 'worn', 'worn', null])[1 + (g / 7) % 10]::text,
          (array[null, null, null, null, null, 'broken', null, null, null, null])[1 + (g / 7) % 10]::text,
          now() - interval '365 days' * random()
        from generate_series(0, ${CUTTERS - 1}) g,
          (select array_agg(id order by id) as ids from cutter_types where shop_id = ${shop.id}) t`.execute(tx)
      // Statistics for the rows just written, before the insert below joins a million generated
      // rows against them: without them the planner takes the new cutters for an empty table and
      // joins in a nested loop (minutes at 100 % of a core instead of seconds).
      await sql`analyze cutters, cutter_types, materials`.execute(tx)
      console.log(`[seed:volume] shop ${shop.id}: ${CUTTERS} cutters; writing ${COUNT} cut logs`)

      // Replica mode skips the roll-up trigger and the per-row foreign-key checks (three a log,
      // which cost more than the insert itself); the rows are made from this shop's own ids.
      await sql`set local session_replication_role = replica`.execute(tx)
      // Each log is one of 100 in its cutter's year, 34 to a life; minutes are drawn so that a
      // life used about one rated life at "true" factors 0.8 to 1.2 times the starting ones.
      await sql`
        with c as (
          select row_number() over (order by c.id) - 1 as k, c.id, t.rated_life_minutes as rated
          from cutters c join cutter_types t on t.id = c.type_id where c.shop_id = ${shop.id}
        ), m as (
          select row_number() over (order by id) - 1 as k, id, wear_factor, wear_factor * (0.8 + 0.4 * ((id * 7919) % 11) / 10.0) as truth
          from materials where shop_id = ${shop.id}
        ), g as (
          select g, g % ${CUTTERS} as ck, g / ${CUTTERS} as j, floor(random() * (select count(*) from m))::int as mk, random() as r1, random() as r2
          from generate_series(0, ${COUNT - 1}) g
        ), logs as (
          select g.g, c.id as cutter_id, m.id as material_id, m.wear_factor, c.rated, least(2, g.j / ${LOGS_PER_LIFE}) as regrinds,
            round((c.rated * (case when g.j < ${LOGS_PER_LIFE} then 1 else 0.8 end) / (${LOGS_PER_LIFE} * m.truth) * (0.7 + 0.6 * g.r1))::numeric, 2) as minutes,
            g.r2, g.j
          from g join c on c.k = g.ck join m on m.k = g.mk
        )
        insert into cut_logs (shop_id, cutter_id, machine_id, operator_id, material_id, minutes, wear_factor, life_added, regrind_count,
          outcome, idempotency_key, cut_at)
        select ${shop.id}, cutter_id, (${sql.val(machines.map((x) => x.id))}::int[])[1 + g % 3], (${sql.val(people.slice(1).map((x) => x.id))}::int[])[1 + (g / 7) % 3],
          material_id, greatest(minutes, 0.01), wear_factor,
          round(greatest(minutes, 0.01) * wear_factor / (rated * (case when regrinds = 0 then 1 else 0.8 end)), 6), regrinds,
          case when r2 < 0.90 then 'clean' when r2 < 0.94 then 'fuzzy' when r2 < 0.97 then 'chip_out' when r2 < 0.995 then 'melted' else 'broken' end,
          'volume-' || g, now() - interval '365 days' + interval '1 second' * floor((j + random()) * 315360)
        from logs`.execute(tx)
      await sql`set local session_replication_role = origin`.execute(tx)
      // Fresh statistics and room to group in memory, or the rebuild plans for an empty table.
      await sql`analyze cut_logs`.execute(tx)
      await sql`set local work_mem = '256MB'`.execute(tx)
      await sql`select rebuild_cut_log_roll_ups(${shop.id})`.execute(tx)
      await sql`select rebuild_cut_cleanup_roll_up(${shop.id})`.execute(tx)
      // The types' longest cut, which the insert trigger keeps but replica mode skipped.
      await sql`update cutter_types t set longest_cut_minutes = x.longest
        from (select c.type_id, max(l.minutes) as longest from cut_logs l join cutters c on c.id = l.cutter_id
          where l.shop_id = ${shop.id} group by 1) x
        where t.shop_id = ${shop.id} and t.id = x.type_id`.execute(tx)
      return shop.id
    })
    await sql`analyze cut_logs; analyze cut_log_daily; analyze cut_sharp_lives; analyze cutters`.execute(db)
    const daily = await db.selectFrom('cut_log_daily').select((eb) => eb.fn.countAll<number>().as('n')).where('shop_id', '=', shopId).executeTakeFirstOrThrow()
    const lives = await db.selectFrom('cut_sharp_lives').select((eb) => eb.fn.countAll<number>().as('n')).where('shop_id', '=', shopId).executeTakeFirstOrThrow()
    console.log(`[seed:volume] shop ${shopId}: ${COUNT} cut logs, ${daily.n} daily roll-up rows, ${lives.n} life roll-up rows in ${((Date.now() - started) / 1000).toFixed(1)} s`)
    console.log(`[seed:volume] sign in as ${VOLUME_OWNER} / kerfbook-demo`)
  } finally {
    await db.destroy()
  }
}

main().catch((err) => {
  console.error('[seed:volume] failed:', err instanceof Error ? err.message : err)
  process.exit(1)
})
