// A new log's raising of its type's longest cut moves into the roll-up trigger, which already
// looks the log's type up: one trigger and one lookup a log instead of two, and no update
// statement at all unless the log is the longest yet. Logging a cut is the hot path; the
// longest-cut trigger on inserts looked the cutter's type up again for every log. Corrections
// and voids still recount the longest in cut_logs_longest (its update trigger, unchanged).
import { sql, type Kysely } from 'kysely'

// cut_log_roll_up_apply as 2026_12_14_0001_shop_days left it, written out so that down needs no import.
const APPLY_BEFORE = `
    create or replace function cut_log_roll_up_apply(r cut_logs, s integer) returns void language plpgsql as $$
    declare
      t record;
      m text := r.material_id::text;
      left_in_material numeric;
    begin
      if r.voided_at is not null then return; end if;
      select ct.id, ct.rated_life_minutes, sh.time_zone into t
        from cutters c join cutter_types ct on ct.id = c.type_id and ct.shop_id = c.shop_id
        join shops sh on sh.id = c.shop_id
        where c.id = r.cutter_id and c.shop_id = r.shop_id;
      insert into cut_log_daily as d (shop_id, day, material_id, machine_id, operator_id, type_id, logs, minutes, new_lives,
          clean, melted, chip_out, fuzzy, broken)
        values (r.shop_id, (r.cut_at at time zone t.time_zone)::date, r.material_id, r.machine_id, r.operator_id, t.id, s,
          s * r.minutes, s * (r.minutes * r.wear_factor / t.rated_life_minutes)::numeric(16,6),
          s * (r.outcome = 'clean')::int, s * (r.outcome = 'melted')::int, s * (r.outcome = 'chip_out')::int,
          s * (r.outcome = 'fuzzy')::int, s * (r.outcome = 'broken')::int)
        on conflict (shop_id, day, material_id, machine_id, operator_id, type_id) do update set
          logs = d.logs + excluded.logs, minutes = d.minutes + excluded.minutes, new_lives = d.new_lives + excluded.new_lives,
          clean = d.clean + excluded.clean, melted = d.melted + excluded.melted, chip_out = d.chip_out + excluded.chip_out,
          fuzzy = d.fuzzy + excluded.fuzzy, broken = d.broken + excluded.broken;
      if s < 0 then
        delete from cut_log_daily where shop_id = r.shop_id and day = (r.cut_at at time zone t.time_zone)::date and material_id = r.material_id
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
    end $$;
`

const APPLY_WITH_LONGEST = `
    create or replace function cut_log_roll_up_apply(r cut_logs, s integer) returns void language plpgsql as $$
    declare
      t record;
      m text := r.material_id::text;
      left_in_material numeric;
    begin
      if r.voided_at is not null then return; end if;
      select ct.id, ct.rated_life_minutes, ct.longest_cut_minutes, sh.time_zone into t
        from cutters c join cutter_types ct on ct.id = c.type_id and ct.shop_id = c.shop_id
        join shops sh on sh.id = c.shop_id
        where c.id = r.cutter_id and c.shop_id = r.shop_id;
      insert into cut_log_daily as d (shop_id, day, material_id, machine_id, operator_id, type_id, logs, minutes, new_lives,
          clean, melted, chip_out, fuzzy, broken)
        values (r.shop_id, (r.cut_at at time zone t.time_zone)::date, r.material_id, r.machine_id, r.operator_id, t.id, s,
          s * r.minutes, s * (r.minutes * r.wear_factor / t.rated_life_minutes)::numeric(16,6),
          s * (r.outcome = 'clean')::int, s * (r.outcome = 'melted')::int, s * (r.outcome = 'chip_out')::int,
          s * (r.outcome = 'fuzzy')::int, s * (r.outcome = 'broken')::int)
        on conflict (shop_id, day, material_id, machine_id, operator_id, type_id) do update set
          logs = d.logs + excluded.logs, minutes = d.minutes + excluded.minutes, new_lives = d.new_lives + excluded.new_lives,
          clean = d.clean + excluded.clean, melted = d.melted + excluded.melted, chip_out = d.chip_out + excluded.chip_out,
          fuzzy = d.fuzzy + excluded.fuzzy, broken = d.broken + excluded.broken;
      if s < 0 then
        delete from cut_log_daily where shop_id = r.shop_id and day = (r.cut_at at time zone t.time_zone)::date and material_id = r.material_id
          and machine_id is not distinct from r.machine_id and operator_id is not distinct from r.operator_id and type_id = t.id
          and logs <= 0;
      end if;

      if s > 0 then
        -- A log longer than the type's longest raises it (a correction or a void recounts it in
        -- cut_logs_longest, which runs first).
        if t.longest_cut_minutes is null or t.longest_cut_minutes < r.minutes then
          update cutter_types set longest_cut_minutes = r.minutes
            where shop_id = r.shop_id and id = t.id and (longest_cut_minutes is null or longest_cut_minutes < r.minutes);
        end if;
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
    end $$;
`

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    ${sql.raw(APPLY_WITH_LONGEST)}
    drop trigger cut_logs_longest_insert on cut_logs;
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    ${sql.raw(APPLY_BEFORE)}
    create trigger cut_logs_longest_insert after insert on cut_logs
      for each row execute function cut_logs_longest();
  `.execute(db)
}
