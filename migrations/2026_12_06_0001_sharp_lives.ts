// The wear fit's roll-up becomes one row per sharp life (cutter and regrind count) with its
// minutes by material in a jsonb object, instead of one row per life and material. The fit
// reads finished lives whole, so at a million logs it reads tens of thousands of rows rather
// than grouping hundreds of thousands (about 0.8 s of the wear route's time).
import { sql, type Kysely } from 'kysely'
import { CUT_LOG_LIVES_TABLE, DAILY_ON_INSERT, DAILY_REBUILD, defineRollUpFunctions } from './2026_12_05_0001_insights'

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
