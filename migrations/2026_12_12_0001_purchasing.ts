// Purchasing the shop can trust: per type an optional minimum and maximum on hand, spares per
// machine and "do not reorder"; the shop's review interval (how often the crib places orders);
// each supplier's regrind turnaround; regrind batch items received one by one, with the
// reason when the regrinder scrapped a bit.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table cutter_types
      add column min_on_hand integer check (min_on_hand is null or min_on_hand between 0 and 10000),
      add column max_on_hand integer check (max_on_hand is null or max_on_hand between 0 and 10000),
      add column spares_per_machine integer check (spares_per_machine is null or spares_per_machine between 0 and 100),
      add column do_not_reorder boolean not null default false,
      add constraint cutter_types_min_max_check check (min_on_hand is null or max_on_hand is null or min_on_hand <= max_on_hand);

    alter table suppliers
      add column regrind_turnaround_days integer not null default 10 check (regrind_turnaround_days between 1 and 365);

    alter table shops
      add column review_interval_days integer not null default 7 check (review_interval_days between 1 and 90);

    alter table regrind_batch_items
      add column received_at timestamptz,
      add column scrap_reason text check (scrap_reason is null or length(scrap_reason) between 1 and 500);
    -- Items of batches already received came back with their batch.
    update regrind_batch_items i set received_at = b.received_at
      from regrind_batches b where b.id = i.batch_id and b.shop_id = i.shop_id and i.result is not null;
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    alter table regrind_batch_items drop column scrap_reason, drop column received_at;
    alter table shops drop column review_interval_days;
    alter table suppliers drop column regrind_turnaround_days;
    alter table cutter_types drop constraint cutter_types_min_max_check,
      drop column do_not_reorder, drop column spares_per_machine, drop column max_on_hand, drop column min_on_hand;
  `.execute(db)
}
