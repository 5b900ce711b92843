// Loading and returning a cutter carry the phone's idempotency key, as cut logs do: an action
// that waited offline and is sent again after a lost answer is recognised by its event and not
// done twice, even when the cutter has moved since.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table cutter_events add column idempotency_key text
      check (idempotency_key is null or length(idempotency_key) between 8 and 100);
    create unique index cutter_events_shop_id_idempotency_key on cutter_events (shop_id, idempotency_key)
      where idempotency_key is not null;
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop index cutter_events_shop_id_idempotency_key;
    alter table cutter_events drop column idempotency_key;
  `.execute(db)
}
