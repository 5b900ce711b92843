// Owner insights at any size: two roll-ups of the cut logs kept by a trigger as each log is
// written (so every writer, the spindle route, the seed and any import, keeps them right), and
// a record of who adopted learned wear factors and when.
//  - cut_log_daily: one row per shop, UTC day, material, machine, operator and cutter type;
//    cost and outcome figures read it instead of the raw logs.
//  - cut_log_lives: one row per cutter, sharp life (regrind count) and material; the wear fit
//    reads it instead of the raw logs.
// Cut logs are only ever inserted; a shop's deletion cascades to both roll-ups.
import { sql, type Kysely } from 'kysely'

// The daily roll-up's part of the trigger (it sets the record t) and of the rebuild, and the
// per-life-and-material table. 2026_12_06_0001 keeps its own copy of each (its down makes them
// again), so that neither migration depends on the other's text.
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
    create table cut_log_daily (
      shop_id integer not null references shops(id) on delete cascade,
      day date not null,
      material_id integer not null,
      machine_id integer,
      operator_id integer,
      type_id integer not null,
      logs integer not null default 0,
      minutes numeric(14,2) not null default 0,
      -- New-cutter lives used: Σ minutes × wear factor / rated life, the basis of tooling cost.
      new_lives numeric(16,6) not null default 0,
      clean integer not null default 0,
      melted integer not null default 0,
      chip_out integer not null default 0,
      fuzzy integer not null default 0,
      broken integer not null default 0,
      unique nulls not distinct (shop_id, day, material_id, machine_id, operator_id, type_id)
    );

${sql.raw(CUT_LOG_LIVES_TABLE)}
  `.execute(db)
  await defineRollUpFunctions(db)
  await sql`
    create trigger cut_logs_roll_up after insert on cut_logs for each row execute function cut_logs_roll_up();

    select rebuild_cut_log_roll_ups(id) from shops;

    create index cut_log_daily_shop_day_idx on cut_log_daily (shop_id, day);

    create table wear_factor_adoptions (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      material_id integer not null,
      from_factor numeric(6,3) not null,
      to_factor numeric(6,3) not null,
      lives integer not null,
      -- The history the fit was made from (UTC dates, both included).
      from_date date not null,
      to_date date not null,
      adopted_by integer references users(id) on delete set null,
      adopted_at timestamptz not null default now(),
      foreign key (shop_id, material_id) references materials (shop_id, id) on delete cascade
    );
    create index wear_factor_adoptions_shop_idx on wear_factor_adoptions (shop_id, adopted_at desc);

    -- Spend by month reads cutters by the day they arrived.
    create index cutters_shop_received_idx on cutters (shop_id, received_at);
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop index if exists cutters_shop_received_idx;
    drop table if exists wear_factor_adoptions;
    drop trigger if exists cut_logs_roll_up on cut_logs;
    drop function if exists cut_logs_roll_up();
    drop function if exists rebuild_cut_log_roll_ups(integer);
    drop table if exists cut_log_lives, cut_log_daily;
  `.execute(db)
}

// The roll-up functions as this migration makes them.
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
