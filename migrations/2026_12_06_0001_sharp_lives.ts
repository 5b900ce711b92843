// The wear fit's roll-up becomes one row per sharp life (cutter and regrind count) with its
// minutes by material in a jsonb object, instead of one row per life and material. The fit
// reads finished lives whole, so at a million logs it reads tens of thousands of rows rather
// than grouping hundreds of thousands (about 0.8 s of the wear route's time).
import { sql, type Kysely } from 'kysely'

// As 2026_12_05_0001_insights wrote them (a copy, so that this migration holds all it applies):
// the daily roll-up's part of the trigger (it sets the record t) and of the rebuild, and the
// per-life-and-material table that this migration replaces and its down makes again.
const DAILY_ON_INSERT = `
      select ct.id, ct.rated_life_minutes into t
        from cutters c join cutter_types ct on ct.id = c.type_id and ct.shop_id = c.shop_id
        where c.id = new.cutter_id and c.shop_id = new.shop_id;
      insert into cut_log_daily as d (shop_id, day, material_id, machine_id, operator_id, type_id, logs, minutes, new_lives,
          clean, melted, chip_out, fuzzy, broken)
        values (new.shop_id, (new.cut_at at time zone 'UTC')::date, new.material_id, new.machine_id, new.operator_id, t.id, 1,
          new.minutes, new.minutes * new.wear_factor / t.rated_life_minutes,
          (new.outcome = 'clean')::int, (new.outcome = 'melted')::int, (new.outcome = 'chip_out')::int,
          (new.outcome = 'fuzzy')::int, (new.outcome = 'broken')::int)
        on conflict (shop_id, day, material_id, machine_id, operator_id, type_id) do update set
          logs = d.logs + 1, minutes = d.minutes + excluded.minutes, new_lives = d.new_lives + excluded.new_lives,
          clean = d.clean + excluded.clean, melted = d.melted + excluded.melted, chip_out = d.chip_out + excluded.chip_out,
          fuzzy = d.fuzzy + excluded.fuzzy, broken = d.broken + excluded.broken;
`
const DAILY_REBUILD = `
      delete from cut_log_daily where shop_id = p_shop;
      insert into cut_log_daily (shop_id, day, material_id, machine_id, operator_id, type_id, logs, minutes, new_lives,
          clean, melted, chip_out, fuzzy, broken)
        select l.shop_id, (l.cut_at at time zone 'UTC')::date, l.material_id, l.machine_id, l.operator_id, t.id, count(*),
          sum(l.minutes), sum(l.minutes * l.wear_factor / t.rated_life_minutes),
          count(*) filter (where l.outcome = 'clean'), count(*) filter (where l.outcome = 'melted'),
          count(*) filter (where l.outcome = 'chip_out'), count(*) filter (where l.outcome = 'fuzzy'),
          count(*) filter (where l.outcome = 'broken')
        from cut_logs l
        join cutters c on c.id = l.cutter_id and c.shop_id = l.shop_id
        join cutter_types t on t.id = c.type_id and t.shop_id = c.shop_id
        where l.shop_id = p_shop
        group by 1, 2, 3, 4, 5, 6;
`
const CUT_LOG_LIVES_TABLE = `
    create table cut_log_lives (
      shop_id integer not null references shops(id) on delete cascade,
      cutter_id integer not null,
      regrind_count integer not null,
      material_id integer not null,
      logs integer not null default 0,
      minutes numeric(14,2) not null default 0,
      -- Σ life_added / wear factor = Σ minutes / (rated life × life scale) as in force when logged.
      sharp_share numeric(16,8) not null default 0,
      last_cut_at timestamptz not null,
      primary key (shop_id, cutter_id, regrind_count, material_id)
    );`


export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create table cut_sharp_lives (
      shop_id integer not null references shops(id) on delete cascade,
      cutter_id integer not null,
      regrind_count integer not null,
      logs integer not null default 0,
      minutes numeric(14,2) not null default 0,
      -- Σ life_added / wear factor = Σ minutes / (rated life × life scale) as in force when logged.
      sharp_share numeric(16,8) not null default 0,
      -- Material id (as text) → minutes cut in it during this life.
      material_minutes jsonb not null default '{}',
      last_cut_at timestamptz not null,
      primary key (shop_id, cutter_id, regrind_count)
    );

    create or replace function cut_logs_roll_up() returns trigger language plpgsql as $$
    declare
      t record;
      m text := new.material_id::text;
    begin
${sql.raw(DAILY_ON_INSERT)}
      insert into cut_sharp_lives as l (shop_id, cutter_id, regrind_count, logs, minutes, sharp_share, material_minutes, last_cut_at)
        values (new.shop_id, new.cutter_id, new.regrind_count, 1, new.minutes, new.life_added / new.wear_factor,
          jsonb_build_object(m, new.minutes), new.cut_at)
        on conflict (shop_id, cutter_id, regrind_count) do update set
          logs = l.logs + 1, minutes = l.minutes + excluded.minutes, sharp_share = l.sharp_share + excluded.sharp_share,
          material_minutes = l.material_minutes
            || jsonb_build_object(m, coalesce((l.material_minutes ->> m)::numeric, 0) + new.minutes),
          last_cut_at = greatest(l.last_cut_at, excluded.last_cut_at);
      return null;
    end $$;

    create or replace function rebuild_cut_log_roll_ups(p_shop integer) returns void language sql as $$
      delete from cut_sharp_lives where shop_id = p_shop;
${sql.raw(DAILY_REBUILD)}
      insert into cut_sharp_lives (shop_id, cutter_id, regrind_count, logs, minutes, sharp_share, material_minutes, last_cut_at)
        select shop_id, cutter_id, regrind_count, sum(logs), sum(minutes), sum(sharp_share),
          jsonb_object_agg(material_id::text, minutes), max(last_cut_at)
        from (
          select shop_id, cutter_id, regrind_count, material_id, count(*)::int as logs, sum(minutes) as minutes,
            sum(life_added / wear_factor) as sharp_share, max(cut_at) as last_cut_at
          from cut_logs where shop_id = p_shop
          group by 1, 2, 3, 4
        ) by_material
        group by 1, 2, 3;
    $$;

    drop table cut_log_lives;
    select rebuild_cut_log_roll_ups(id) from shops;
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
${sql.raw(CUT_LOG_LIVES_TABLE)}
  `.execute(db)
  await defineRollUpFunctions(db)
  await sql`
    drop table cut_sharp_lives;
    select rebuild_cut_log_roll_ups(id) from shops;
  `.execute(db)
}

// The roll-up functions as 2026_12_05_0001_insights made them; the down puts them back.
async function defineRollUpFunctions(db: Kysely<any>): Promise<void> {
  await sql`
    create or replace function cut_logs_roll_up() returns trigger language plpgsql as $$
    declare
      t record;
    begin
${sql.raw(DAILY_ON_INSERT)}
      insert into cut_log_lives as l (shop_id, cutter_id, regrind_count, material_id, logs, minutes, sharp_share, last_cut_at)
        values (new.shop_id, new.cutter_id, new.regrind_count, new.material_id, 1, new.minutes, new.life_added / new.wear_factor, new.cut_at)
        on conflict (shop_id, cutter_id, regrind_count, material_id) do update set
          logs = l.logs + 1, minutes = l.minutes + excluded.minutes, sharp_share = l.sharp_share + excluded.sharp_share,
          last_cut_at = greatest(l.last_cut_at, excluded.last_cut_at);
      return null;
    end $$;

    -- Rebuilds one shop's roll-ups from its raw logs: for this migration and after a bulk load
    -- made with the trigger switched off (scripts/seed-volume.ts).
    create or replace function rebuild_cut_log_roll_ups(p_shop integer) returns void language sql as $$
      delete from cut_log_lives where shop_id = p_shop;
${sql.raw(DAILY_REBUILD)}
      insert into cut_log_lives (shop_id, cutter_id, regrind_count, material_id, logs, minutes, sharp_share, last_cut_at)
        select shop_id, cutter_id, regrind_count, material_id, count(*), sum(minutes), sum(life_added / wear_factor), max(cut_at)
        from cut_logs where shop_id = p_shop
        group by 1, 2, 3, 4;
    $$;
  `.execute(db)
}
