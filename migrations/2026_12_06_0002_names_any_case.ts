// Supplier and cutter-type names are unique in a shop whatever their case, as the app already
// checks: "Downcut 3/8" and "downcut 3/8" on two shelves are one name to the people reading
// them. The index makes it hold when two people save at once, too.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table suppliers drop constraint suppliers_shop_id_name_key;
    create unique index suppliers_shop_id_lower_name_key on suppliers (shop_id, lower(name));
    alter table cutter_types drop constraint cutter_types_shop_id_name_key;
    create unique index cutter_types_shop_id_lower_name_key on cutter_types (shop_id, lower(name));
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop index cutter_types_shop_id_lower_name_key;
    alter table cutter_types add constraint cutter_types_shop_id_name_key unique (shop_id, name);
    drop index suppliers_shop_id_lower_name_key;
    alter table suppliers add constraint suppliers_shop_id_name_key unique (shop_id, name);
  `.execute(db)
}
