// Cut logs can be corrected (minutes, material, outcome, note) or voided, each with a reason.
// A voided log stays (its history and idempotency key too) but counts nowhere. The roll-up
// trigger learns updates: it takes the row's old figures out of cut_log_daily and
// cut_sharp_lives and puts its new ones in, so a correction on a cutter reground since changes
// the sharp life the log belongs to. Emptied roll-up rows go, so the roll-ups stay equal to a
// recount of the logs that count. cut_log_changes keeps each change: who, why, before and after.
import { sql, type Kysely } from 'kysely'

// The sharp-lives migration's functions (2026_12_06_0001), written out so that down needs no import.
const OLD_TRIGGER = `
    create or replace function cut_logs_roll_up() returns trigger language plpgsql as $$
    declare
      t record;
      m text := new.material_id::text;
    begin
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
      insert into cut_sharp_lives as l (shop_id, cutter_id, regrind_count, logs, minutes, sharp_share, material_minutes, last_cut_at)
        values (new.shop_id, new.cutter_id, new.regrind_count, 1, new.minutes, new.life_added / new.wear_factor,
          jsonb_build_object(m, new.minutes), new.cut_at)
        on conflict (shop_id, cutter_id, regrind_count) do update set
          logs = l.logs + 1, minutes = l.minutes + excluded.minutes, sharp_share = l.sharp_share + excluded.sharp_share,
          material_minutes = l.material_minutes
            || jsonb_build_object(m, coalesce((l.material_minutes ->> m)::numeric, 0) + new.minutes),
          last_cut_at = greatest(l.last_cut_at, excluded.last_cut_at);
      return null;
    end $$;`

function rebuild(onlyCounting: boolean): string {
  const counting = onlyCounting ? 'and l.voided_at is null' : ''
  return `
    create or replace function rebuild_cut_log_roll_ups(p_shop integer) returns void language sql as $$
      delete from cut_sharp_lives where shop_id = p_shop;
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
        where l.shop_id = p_shop ${counting}
        group by 1, 2, 3, 4, 5, 6;
      insert into cut_sharp_lives (shop_id, cutter_id, regrind_count, logs, minutes, sharp_share, material_minutes, last_cut_at)
        select shop_id, cutter_id, regrind_count, sum(logs), sum(minutes), sum(sharp_share),
          jsonb_object_agg(material_id::text, minutes), max(last_cut_at)
        from (
          select shop_id, cutter_id, regrind_count, material_id, count(*)::int as logs, sum(minutes) as minutes,
            sum(life_added / wear_factor) as sharp_share, max(cut_at) as last_cut_at
          from cut_logs l where shop_id = p_shop ${counting}
          group by 1, 2, 3, 4
        ) by_material
        group by 1, 2, 3;
    $$;`
}

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table cut_logs add column voided_at timestamptz;
    create index cut_logs_counting_idx on cut_logs (shop_id, cut_at) where voided_at is null;

    create table cut_log_changes (
      id bigint generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      cut_log_id bigint not null references cut_logs(id),
      cutter_id integer not null,
      kind text not null check (kind in ('corrected', 'voided')),
      actor_id integer references users(id) on delete set null,
      reason text not null check (length(trim(reason)) between 1 and 500),
      -- The log's minutes, material, outcome, note and life added before and after.
      before jsonb not null,
      after jsonb not null,
      created_at timestamptz not null default now(),
      foreign key (shop_id, cutter_id) references cutters (shop_id, id)
    );
    create index cut_log_changes_log_idx on cut_log_changes (cut_log_id, created_at);

    alter table cutter_events drop constraint cutter_events_kind_check;
    alter table cutter_events add constraint cutter_events_kind_check check (kind in ('received', 'loaded', 'returned', 'cut_logged',
      'flagged_dull', 'flagged_broken', 'sent_to_regrind', 'reground', 'retired', 'lost', 'found', 'edited', 'cut_corrected', 'cut_voided'));

    -- Adds (s = 1) or takes out (s = -1) one log's share of both roll-ups; a voided log has none.
    create function cut_log_roll_up_apply(r cut_logs, s integer) returns void language plpgsql as $$
    declare
      t record;
      m text := r.material_id::text;
      left_in_material numeric;
    begin
      if r.voided_at is not null then return; end if;
      select ct.id, ct.rated_life_minutes into t
        from cutters c join cutter_types ct on ct.id = c.type_id and ct.shop_id = c.shop_id
        where c.id = r.cutter_id and c.shop_id = r.shop_id;
      insert into cut_log_daily as d (shop_id, day, material_id, machine_id, operator_id, type_id, logs, minutes, new_lives,
          clean, melted, chip_out, fuzzy, broken)
        values (r.shop_id, (r.cut_at at time zone 'UTC')::date, r.material_id, r.machine_id, r.operator_id, t.id, s,
          s * r.minutes, s * (r.minutes * r.wear_factor / t.rated_life_minutes)::numeric(16,6),
          s * (r.outcome = 'clean')::int, s * (r.outcome = 'melted')::int, s * (r.outcome = 'chip_out')::int,
          s * (r.outcome = 'fuzzy')::int, s * (r.outcome = 'broken')::int)
        on conflict (shop_id, day, material_id, machine_id, operator_id, type_id) do update set
          logs = d.logs + excluded.logs, minutes = d.minutes + excluded.minutes, new_lives = d.new_lives + excluded.new_lives,
          clean = d.clean + excluded.clean, melted = d.melted + excluded.melted, chip_out = d.chip_out + excluded.chip_out,
          fuzzy = d.fuzzy + excluded.fuzzy, broken = d.broken + excluded.broken;
      if s < 0 then
        delete from cut_log_daily where shop_id = r.shop_id and day = (r.cut_at at time zone 'UTC')::date and material_id = r.material_id
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

    create or replace function cut_logs_roll_up() returns trigger language plpgsql as $$
    begin
      if tg_op = 'UPDATE' then
        perform cut_log_roll_up_apply(old, -1);
      end if;
      perform cut_log_roll_up_apply(new, 1);
      return null;
    end $$;
    create trigger cut_logs_roll_up_update after update on cut_logs for each row
      when (old.minutes is distinct from new.minutes or old.material_id is distinct from new.material_id
        or old.outcome is distinct from new.outcome or old.wear_factor is distinct from new.wear_factor
        or old.life_added is distinct from new.life_added or old.voided_at is distinct from new.voided_at)
      execute function cut_logs_roll_up();
    ${sql.raw(rebuild(true))}
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop trigger cut_logs_roll_up_update on cut_logs;
    ${sql.raw(OLD_TRIGGER)}
    drop function cut_log_roll_up_apply(cut_logs, integer);
    ${sql.raw(rebuild(false))}
    delete from cutter_events where kind in ('cut_corrected', 'cut_voided');
    alter table cutter_events drop constraint cutter_events_kind_check;
    alter table cutter_events add constraint cutter_events_kind_check check (kind in ('received', 'loaded', 'returned', 'cut_logged',
      'flagged_dull', 'flagged_broken', 'sent_to_regrind', 'reground', 'retired', 'lost', 'found', 'edited'));
    drop table cut_log_changes;
    drop index cut_logs_counting_idx;
    alter table cut_logs drop column voided_at;
    select rebuild_cut_log_roll_ups(id) from shops;
  `.execute(db)
}
