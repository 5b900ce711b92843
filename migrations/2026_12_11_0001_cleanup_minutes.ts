// Cleanup minutes: the hand-finishing time per part a poor edge costs, optional on a cut log (the
// cut form and the runs of NC programs give it), and the shop's labour rate that turns it into
// money on the owner's insights. A roll-up of its own, one row per shop, UTC day, cutter type and
// material, kept by a trigger that fires only for logs that carry cleanup minutes, so the other
// roll-ups and their rebuild stay as they are and logs without cleanup cost nothing more.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table cut_logs add column cleanup_minutes_per_part numeric(6,2)
      check (cleanup_minutes_per_part is null or (cleanup_minutes_per_part >= 0 and cleanup_minutes_per_part <= 600));

    -- Integer cents per hour of hand-finishing; null until the owner sets it.
    alter table shops add column labour_rate_cents_per_hour integer
      check (labour_rate_cents_per_hour is null or (labour_rate_cents_per_hour >= 0 and labour_rate_cents_per_hour <= 1000000));

    create table cut_cleanup_daily (
      shop_id integer not null references shops(id) on delete cascade,
      day date not null,
      type_id integer not null,
      material_id integer not null,
      -- Logs that gave cleanup minutes, and the sum of their minutes per part.
      logs integer not null default 0,
      minutes numeric(14,2) not null default 0,
      primary key (shop_id, day, type_id, material_id)
    );

    create function cut_logs_cleanup_roll_up() returns trigger language plpgsql as $$
    begin
      insert into cut_cleanup_daily as d (shop_id, day, type_id, material_id, logs, minutes)
        select new.shop_id, (new.cut_at at time zone 'UTC')::date, c.type_id, new.material_id, 1, new.cleanup_minutes_per_part
          from cutters c where c.id = new.cutter_id and c.shop_id = new.shop_id
        on conflict (shop_id, day, type_id, material_id) do update set
          logs = d.logs + 1, minutes = d.minutes + excluded.minutes;
      return null;
    end $$;

    create trigger cut_logs_roll_up_cleanup after insert on cut_logs
      for each row when (new.cleanup_minutes_per_part is not null) execute function cut_logs_cleanup_roll_up();

    -- Rebuilds one shop's cleanup roll-up from its logs (after a bulk load in replica mode).
    create function rebuild_cut_cleanup_roll_up(p_shop integer) returns void language sql as $$
      delete from cut_cleanup_daily where shop_id = p_shop;
      insert into cut_cleanup_daily (shop_id, day, type_id, material_id, logs, minutes)
        select l.shop_id, (l.cut_at at time zone 'UTC')::date, c.type_id, l.material_id, count(*), sum(l.cleanup_minutes_per_part)
        from cut_logs l join cutters c on c.id = l.cutter_id and c.shop_id = l.shop_id
        where l.shop_id = p_shop and l.cleanup_minutes_per_part is not null
        group by 1, 2, 3, 4;
    $$;
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop trigger if exists cut_logs_roll_up_cleanup on cut_logs;
    drop function if exists rebuild_cut_cleanup_roll_up(integer);
    drop function if exists cut_logs_cleanup_roll_up();
    drop table if exists cut_cleanup_daily;
    alter table shops drop column if exists labour_rate_cents_per_hour;
    alter table cut_logs drop column if exists cleanup_minutes_per_part;
  `.execute(db)
}
