// The shop's chip-load table for feeds and speeds: one row per material family and diameter
// band, with the surface-speed target, plunge and depth-per-pass starting points and where the
// figures come from. Every shop that exists now gets the starting rows; new shops get them at
// sign-up. The rows it inserts are written out below, so the migration does the same whatever
// shared/kerf/chip-loads.ts says later.
import { sql, type Kysely } from 'kysely'

// The starting chip-load table as it stood when this migration was written (a frozen copy:
// later changes to the product's starting figures do not change what this migration inserts).
// Columns: family, diameter min and max (mm), chip load min and max (mm), surface speed (m/min),
// plunge fraction, depth per pass factor, source (index into SOURCES).
const SOURCES = [
  'Chip load: common practice, hard plastic (cast acrylic) at 1/8 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, hard plastic (cast acrylic) at 1/4 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: Kerfbook rule, the common-practice hard plastic (cast acrylic) range at 1/4 in x 1.5 (in proportion to diameter, at 3/8 in). Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, soft plastic at 1/8 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, soft plastic at 1/4 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: Kerfbook rule, the common-practice soft plastic range at 1/4 in x 1.5 (in proportion to diameter, at 3/8 in). Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, hardwood at 1/8 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, hardwood at 1/4 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: Kerfbook rule, the common-practice hardwood range at 1/4 in x 1.5 (in proportion to diameter, at 3/8 in). Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, MDF and particleboard at 1/8 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, MDF and particleboard at 1/4 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: Kerfbook rule, the common-practice MDF and particleboard range at 1/4 in x 1.5 (in proportion to diameter, at 3/8 in). Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, aluminium at 1/8 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, aluminium at 1/4 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: Kerfbook rule, the common-practice aluminium range at 1/4 in x 1.5 (in proportion to diameter, at 3/8 in). Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, soft plastic (PVC) at 1/8 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: common practice, soft plastic (PVC) at 1/4 in. Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
  'Chip load: Kerfbook rule, the common-practice soft plastic (PVC) range at 1/4 in x 1.5 (in proportion to diameter, at 3/8 in). Surface speed: Kerfbook starting point. Plunge and depth per pass: common practice.',
]

const STARTING_BANDS: ReadonlyArray<[string, number, number, number, number, number, number, number, number]> = [
  ['hard_plastic', 0, 4.7625, 0.0508, 0.1016, 359, 0.333, 0.5, 0],
  ['hard_plastic', 4.7625, 7.9375, 0.127, 0.2286, 359, 0.333, 0.5, 1],
  ['hard_plastic', 7.9375, 14.2875, 0.1905, 0.3429, 359, 0.333, 0.5, 2],
  ['soft_plastic', 0, 4.7625, 0.0762, 0.1524, 359, 0.5, 1, 3],
  ['soft_plastic', 4.7625, 7.9375, 0.1524, 0.254, 359, 0.5, 1, 4],
  ['soft_plastic', 7.9375, 14.2875, 0.2286, 0.381, 359, 0.5, 1, 5],
  ['wood', 0, 4.7625, 0.0508, 0.127, 359, 0.5, 1, 6],
  ['wood', 4.7625, 7.9375, 0.127, 0.2794, 359, 0.5, 1, 7],
  ['wood', 7.9375, 14.2875, 0.1905, 0.4191, 359, 0.5, 1, 8],
  ['sheet_goods', 0, 4.7625, 0.1016, 0.1778, 359, 0.5, 1, 9],
  ['sheet_goods', 4.7625, 7.9375, 0.3048, 0.4064, 359, 0.5, 1, 10],
  ['sheet_goods', 7.9375, 14.2875, 0.4572, 0.6096, 359, 0.5, 1, 11],
  ['non_ferrous', 0, 4.7625, 0.0762, 0.1016, 215, 0.25, 0.25, 12],
  ['non_ferrous', 4.7625, 7.9375, 0.127, 0.1778, 215, 0.25, 0.25, 13],
  ['non_ferrous', 7.9375, 14.2875, 0.1905, 0.2667, 215, 0.25, 0.25, 14],
  ['foam', 0, 4.7625, 0.0762, 0.1524, 359, 0.5, 1, 15],
  ['foam', 4.7625, 7.9375, 0.1524, 0.254, 359, 0.5, 1, 16],
  ['foam', 7.9375, 14.2875, 0.2286, 0.381, 359, 0.5, 1, 17],
  ['composite', 0, 4.7625, 0.0762, 0.1016, 215, 0.333, 0.5, 12],
  ['composite', 4.7625, 7.9375, 0.127, 0.1778, 215, 0.333, 0.5, 13],
  ['composite', 7.9375, 14.2875, 0.1905, 0.2667, 215, 0.333, 0.5, 14],
]

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
    await db.insertInto('chip_loads').values(shops.slice(i, i + SHOPS_PER_INSERT).flatMap((s: { id: number }) => STARTING_BANDS.map(([family, dMin, dMax, cMin, cMax, speed, plunge, depth, source]) => ({
      shop_id: s.id, family, diameter_min_mm: dMin, diameter_max_mm: dMax,
      chip_load_min_mm: cMin, chip_load_max_mm: cMax, surface_speed_m_per_min: speed,
      plunge_fraction: plunge, depth_per_pass_factor: depth, source: SOURCES[source],
    })))).execute()
  }
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop table if exists chip_loads`.execute(db)
}
