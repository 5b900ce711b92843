// Material names are unique in a shop whatever their case, as machines, suppliers and cutter
// types are; a retired material says when it left the pick lists.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table materials add column retired_at timestamptz;
    update materials set retired_at = created_at where not active;
    alter table materials add constraint materials_retired_check check (active = (retired_at is null));
    update materials m set name = left(m.name, 70) || ' (' || d.n || ')'
      from (select id, row_number() over (partition by shop_id, lower(name) order by id) as n from materials) d
      where d.id = m.id and d.n > 1;
    alter table materials drop constraint materials_shop_id_name_key;
    create unique index materials_shop_id_lower_name_key on materials (shop_id, lower(name));
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop index materials_shop_id_lower_name_key;
    alter table materials add constraint materials_shop_id_name_key unique (shop_id, name);
    alter table materials drop constraint materials_retired_check;
    alter table materials drop column retired_at;
  `.execute(db)
}
