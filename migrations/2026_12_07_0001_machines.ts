// Machines say how many cutters they hold: `pockets` is the tool changer's pocket count, 0 for a
// manual collet that holds one bit at a time (it replaces the yes/no `tool_changer`; a changer
// becomes 8 pockets). Spindle speeds stay within 1,000 to 100,000 rpm with min below max; spindle
// power and bed size are optional; a retired machine keeps its history and says when it left.
// Names are unique in a shop whatever their case, as for suppliers and cutter types.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table machines add column pockets integer not null default 0 check (pockets between 0 and 99);
    update machines set pockets = 8 where tool_changer;
    alter table machines drop column tool_changer;

    -- Rows from before the range rule are brought inside it rather than refused.
    alter table machines drop constraint machines_min_rpm_check;
    alter table machines drop constraint machines_check; -- max_rpm's, named by PostgreSQL for its two columns
    update machines set min_rpm = least(greatest(min_rpm, 1000), 99999);
    update machines set max_rpm = least(greatest(max_rpm, min_rpm + 1), 100000);
    alter table machines add constraint machines_rpm_range_check
      check (min_rpm >= 1000 and max_rpm <= 100000 and min_rpm < max_rpm);

    alter table machines add column spindle_power_kw numeric(6,2) check (spindle_power_kw > 0 and spindle_power_kw <= 1000);
    alter table machines add column bed_x_mm numeric(8,1) check (bed_x_mm > 0 and bed_x_mm <= 100000);
    alter table machines add column bed_y_mm numeric(8,1) check (bed_y_mm > 0 and bed_y_mm <= 100000);
    alter table machines add constraint machines_description_length_check check (length(description) <= 500);

    alter table machines add column retired_at timestamptz;
    update machines set retired_at = created_at where not active;
    alter table machines add constraint machines_retired_check check (active = (retired_at is null));

    -- Names differing only in case get a suffix before the index makes them one name.
    update machines m set name = left(m.name, 70) || ' (' || d.n || ')'
      from (select id, row_number() over (partition by shop_id, lower(name) order by id) as n from machines) d
      where d.id = m.id and d.n > 1;
    alter table machines drop constraint machines_shop_id_name_key;
    create unique index machines_shop_id_lower_name_key on machines (shop_id, lower(name));
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop index machines_shop_id_lower_name_key;
    alter table machines add constraint machines_shop_id_name_key unique (shop_id, name);
    alter table machines drop constraint machines_retired_check;
    alter table machines drop column retired_at;
    alter table machines drop constraint machines_description_length_check;
    alter table machines drop column bed_y_mm;
    alter table machines drop column bed_x_mm;
    alter table machines drop column spindle_power_kw;
    alter table machines drop constraint machines_rpm_range_check;
    alter table machines add constraint machines_min_rpm_check check (min_rpm > 0);
    alter table machines add constraint machines_check check (max_rpm >= min_rpm and max_rpm <= 100000);
    alter table machines add column tool_changer boolean not null default false;
    update machines set tool_changer = pockets > 0;
    alter table machines drop column pockets;
  `.execute(db)
}
