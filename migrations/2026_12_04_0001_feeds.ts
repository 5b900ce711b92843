// The shop's chip-load table for feeds and speeds: one row per material family and diameter
// band, with the surface-speed target, plunge and depth-per-pass starting points and where the
// figures come from. Every shop that exists now gets the starting rows; new shops get them at
// sign-up. The starting rows are read from shared/kerf/chip-loads.ts (data, not today's schema).
import { sql, type Kysely } from 'kysely'
import { STARTING_CHIP_LOADS } from '../shared/kerf/chip-loads'

const SHOPS_PER_INSERT = 100

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create table chip_loads (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      family text not null check (family in ('hard_plastic', 'soft_plastic', 'wood', 'sheet_goods', 'non_ferrous', 'foam', 'composite')),
      -- The band holds diameters from min (inclusive) to max (exclusive).
      diameter_min_mm numeric(7,4) not null check (diameter_min_mm >= 0),
      diameter_max_mm numeric(7,4) not null check (diameter_max_mm > diameter_min_mm and diameter_max_mm <= 100),
      -- Per tooth.
      chip_load_min_mm numeric(6,4) not null check (chip_load_min_mm > 0),
      chip_load_max_mm numeric(6,4) not null check (chip_load_max_mm >= chip_load_min_mm and chip_load_max_mm <= 5),
      -- Null: no target, the spindle runs at the machine's top speed.
      surface_speed_m_per_min numeric(7,2) check (surface_speed_m_per_min is null or (surface_speed_m_per_min > 0 and surface_speed_m_per_min <= 5000)),
      -- Plunge feed as a fraction of the cutting feed; depth per pass as a multiple of the diameter.
      plunge_fraction numeric(4,3) check (plunge_fraction is null or (plunge_fraction > 0 and plunge_fraction <= 1)),
      depth_per_pass_factor numeric(5,3) check (depth_per_pass_factor is null or (depth_per_pass_factor > 0 and depth_per_pass_factor <= 10)),
      -- A citation, "common practice", or the shop's own note.
      source text not null check (length(trim(source)) between 1 and 300),
      updated_by integer references users(id) on delete set null,
      updated_at timestamptz not null default now(),
      unique (shop_id, family, diameter_min_mm),
      unique (shop_id, id)
    )
  `.execute(db)

  const shops = await db.selectFrom('shops').select('id').orderBy('id').execute()
  for (let i = 0; i < shops.length; i += SHOPS_PER_INSERT) {
    await db.insertInto('chip_loads').values(shops.slice(i, i + SHOPS_PER_INSERT).flatMap((s: { id: number }) => STARTING_CHIP_LOADS.map((b) => ({
      shop_id: s.id, family: b.family, diameter_min_mm: b.diameterMinMm, diameter_max_mm: b.diameterMaxMm,
      chip_load_min_mm: b.chipLoadMinMm, chip_load_max_mm: b.chipLoadMaxMm, surface_speed_m_per_min: b.surfaceSpeedMPerMin,
      plunge_fraction: b.plungeFraction, depth_per_pass_factor: b.depthPerPassFactor, source: b.source,
    })))).execute()
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop table if exists chip_loads`.execute(db)
}
