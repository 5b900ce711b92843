// The daily roll-ups (cut_log_daily, cut_cleanup_daily) count the shop's days, not UTC's: a
// log's day is its cut_at in the shop's IANA time zone (shops.time_zone), so a cut at 23:30 in
// Chicago is that evening's, not the next UTC day's. The triggers read the zone by the shop's
// primary key and nothing more, so logging a cut stays as cheap. Changing the zone (an update
// of shops.time_zone) rebuilds that shop's day roll-ups from its raw logs in the same
// transaction, after a share lock on cut_logs: logs in flight (which read the old zone) finish
// first and are recounted, and logs after it wait for the commit and read the new zone. The
// lock holds writes of cut logs for the rebuild of one shop, a rare owner's action. So the
// roll-ups always equal a recount of the logs in the shop's current zone.
import { sql, type Kysely } from 'kysely'

// How a day is worked out: the UTC one (as before) or the shop's.
type Day = (cutAt: string, zone: string) => string
const UTC_DAY: Day = (cutAt) => `(${cutAt} at time zone 'UTC')::date`
const SHOP_DAY: Day = (cutAt, zone) => `(${cutAt} at time zone ${zone})::date`

// Adds (s = 1) or takes out (s = -1) one log's share of both roll-ups; a voided log has none.
// As 2026_12_07_0004_cut_log_corrections wrote it, with the day worked out by `day`.
function applyFunction(day: Day, inZone: boolean): string {
  return `
    create or replace function cut_log_roll_up_apply(r cut_logs, s integer) returns void language plpgsql as $$
    declare
      t record;
      m text := r.material_id::text;
      left_in_material numeric;
    begin
      if r.voided_at is not null then return; end if;
      select ct.id, ct.rated_life_minutes, ${inZone ? 'sh.time_zone' : `'UTC'::text as time_zone`} into t
        from cutters c join cutter_types ct on ct.id = c.type_id and ct.shop_id = c.shop_id
        ${inZone ? 'join shops sh on sh.id = c.shop_id' : ''}
        where c.id = r.cutter_id and c.shop_id = r.shop_id;
      insert into cut_log_daily as d (shop_id, day, material_id, machine_id, operator_id, type_id, logs, minutes, new_lives,
          clean, melted, chip_out, fuzzy, broken)
        values (r.shop_id, ${day('r.cut_at', 't.time_zone')}, r.material_id, r.machine_id, r.operator_id, t.id, s,
          s * r.minutes, s * (r.minutes * r.wear_factor / t.rated_life_minutes)::numeric(16,6),
          s * (r.outcome = 'clean')::int, s * (r.outcome = 'melted')::int, s * (r.outcome = 'chip_out')::int,
          s * (r.outcome = 'fuzzy')::int, s * (r.outcome = 'broken')::int)
        on conflict (shop_id, day, material_id, machine_id, operator_id, type_id) do update set
          logs = d.logs + excluded.logs, minutes = d.minutes + excluded.minutes, new_lives = d.new_lives + excluded.new_lives,
          clean = d.clean + excluded.clean, melted = d.melted + excluded.melted, chip_out = d.chip_out + excluded.chip_out,
          fuzzy = d.fuzzy + excluded.fuzzy, broken = d.broken + excluded.broken;
      if s < 0 then
        delete from cut_log_daily where shop_id = r.shop_id and day = ${day('r.cut_at', 't.time_zone')} and material_id = r.material_id
          and machine_id is not distinct from r.machine_id and operator_id is not distinct from r.operator_id and type_id = t.id
          and logs <= 0;
      end if;

      if s > 0 then
        insert into cut_sharp_lives as l (shop_id, cutter_id, regrind_count, logs, minutes, sharp_share, material_minutes, last_cut_at)
          values (r.shop_id, r.cutter_id, r.regrind_count, 1, r.minutes, r.life_added / r.wear_factor,
            jsonb_build_object(m, r.minutes), r.cut_at)
          on conflict (shop_id, cutter_id, regrind_count) do update set
            logs = l.logs + 1, minutes = l.minutes + excluded.minutes, sharp_share = l.sharp_share + excluded.sharp_share,
            material_minutes = l.material_minutes
              || jsonb_build_object(m, coalesce((l.material_minutes ->> m)::numeric, 0) + r.minutes),
            last_cut_at = greatest(l.last_cut_at, excluded.last_cut_at);
      else
        select (material_minutes ->> m)::numeric - r.minutes into left_in_material
          from cut_sharp_lives where shop_id = r.shop_id and cutter_id = r.cutter_id and regrind_count = r.regrind_count;
        update cut_sharp_lives l set
            logs = l.logs - 1, minutes = l.minutes - r.minutes, sharp_share = l.sharp_share - (r.life_added / r.wear_factor)::numeric(16,8),
            material_minutes = case when left_in_material > 0 then l.material_minutes || jsonb_build_object(m, left_in_material)
              else l.material_minutes - m end,
            -- The latest cut still counting in this life (the table already holds the row's new state).
            last_cut_at = coalesce((select max(x.cut_at) from cut_logs x where x.shop_id = r.shop_id and x.cutter_id = r.cutter_id
              and x.regrind_count = r.regrind_count and x.voided_at is null and x.id <> r.id), l.last_cut_at)
          where l.shop_id = r.shop_id and l.cutter_id = r.cutter_id and l.regrind_count = r.regrind_count;
        delete from cut_sharp_lives where shop_id = r.shop_id and cutter_id = r.cutter_id and regrind_count = r.regrind_count and logs <= 0;
      end if;
    end $$;`
}

// As 2026_12_11_0001_cleanup_minutes wrote it, with the day worked out by `day`.
function cleanupFunction(day: Day): string {
  return `
    create or replace function cut_logs_cleanup_roll_up() returns trigger language plpgsql as $$
    begin
      insert into cut_cleanup_daily as d (shop_id, day, type_id, material_id, logs, minutes)
        select new.shop_id, ${day('new.cut_at', 'sh.time_zone')}, c.type_id, new.material_id, 1, new.cleanup_minutes_per_part
          from cutters c join shops sh on sh.id = c.shop_id
          where c.id = new.cutter_id and c.shop_id = new.shop_id
        on conflict (shop_id, day, type_id, material_id) do update set
          logs = d.logs + 1, minutes = d.minutes + excluded.minutes;
      return null;
    end $$;`
}

// The daily parts of the rebuilds: one shop's day roll-ups from its raw logs that count.
function dailyRebuild(day: Day): string {
  return `
      delete from cut_log_daily where shop_id = p_shop;
      insert into cut_log_daily (shop_id, day, material_id, machine_id, operator_id, type_id, logs, minutes, new_lives,
          clean, melted, chip_out, fuzzy, broken)
        select l.shop_id, ${day('l.cut_at', 'sh.time_zone')}, l.material_id, l.machine_id, l.operator_id, t.id, count(*),
          sum(l.minutes), sum(l.minutes * l.wear_factor / t.rated_life_minutes),
          count(*) filter (where l.outcome = 'clean'), count(*) filter (where l.outcome = 'melted'),
          count(*) filter (where l.outcome = 'chip_out'), count(*) filter (where l.outcome = 'fuzzy'),
          count(*) filter (where l.outcome = 'broken')
        from cut_logs l
        join shops sh on sh.id = l.shop_id
        join cutters c on c.id = l.cutter_id and c.shop_id = l.shop_id
        join cutter_types t on t.id = c.type_id and t.shop_id = c.shop_id
        where l.shop_id = p_shop and l.voided_at is null
        group by 1, 2, 3, 4, 5, 6;`
}

function cleanupRebuild(day: Day): string {
  return `
      delete from cut_cleanup_daily where shop_id = p_shop;
      insert into cut_cleanup_daily (shop_id, day, type_id, material_id, logs, minutes)
        select l.shop_id, ${day('l.cut_at', 'sh.time_zone')}, c.type_id, l.material_id, count(*), sum(l.cleanup_minutes_per_part)
        from cut_logs l join shops sh on sh.id = l.shop_id
        join cutters c on c.id = l.cutter_id and c.shop_id = l.shop_id
        where l.shop_id = p_shop and l.cleanup_minutes_per_part is not null
        group by 1, 2, 3, 4;`
}

// As 2026_12_07_0004 wrote it: the daily roll-up and the sharp lives of one shop.
function rebuildFunctions(day: Day): string {
  return `
    create or replace function rebuild_cut_log_roll_ups(p_shop integer) returns void language sql as $$
      delete from cut_sharp_lives where shop_id = p_shop;
${dailyRebuild(day)}
      insert into cut_sharp_lives (shop_id, cutter_id, regrind_count, logs, minutes, sharp_share, material_minutes, last_cut_at)
        select shop_id, cutter_id, regrind_count, sum(logs), sum(minutes), sum(sharp_share),
          jsonb_object_agg(material_id::text, minutes), max(last_cut_at)
        from (
          select shop_id, cutter_id, regrind_count, material_id, count(*)::int as logs, sum(minutes) as minutes,
            sum(life_added / wear_factor) as sharp_share, max(cut_at) as last_cut_at
          from cut_logs l where shop_id = p_shop and l.voided_at is null
          group by 1, 2, 3, 4
        ) by_material
        group by 1, 2, 3;
    $$;

    create or replace function rebuild_cut_cleanup_roll_up(p_shop integer) returns void language sql as $$
${cleanupRebuild(day)}
    $$;`
}

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    ${sql.raw(applyFunction(SHOP_DAY, true))}
    ${sql.raw(cleanupFunction(SHOP_DAY))}
    ${sql.raw(rebuildFunctions(SHOP_DAY))}

    -- Only the day roll-ups, for a change of the shop's time zone (the sharp lives have no days).
    create function rebuild_cut_day_roll_ups(p_shop integer) returns void language sql as $$
${sql.raw(dailyRebuild(SHOP_DAY))}
${sql.raw(cleanupRebuild(SHOP_DAY))}
    $$;

    create function shops_time_zone_changed() returns trigger language plpgsql as $$
    begin
      lock table cut_logs in share mode;
      perform rebuild_cut_day_roll_ups(new.id);
      return null;
    end $$;
    create trigger shops_time_zone_days after update of time_zone on shops for each row
      when (old.time_zone is distinct from new.time_zone) execute function shops_time_zone_changed();

    select rebuild_cut_day_roll_ups(id) from shops;
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop trigger shops_time_zone_days on shops;
    drop function shops_time_zone_changed();
    drop function rebuild_cut_day_roll_ups(integer);
    ${sql.raw(applyFunction(UTC_DAY, false))}
    ${sql.raw(cleanupFunction(UTC_DAY))}
    ${sql.raw(rebuildFunctions(UTC_DAY))}
    select rebuild_cut_log_roll_ups(id), rebuild_cut_cleanup_roll_up(id) from shops;
  `.execute(db)
}
