// The shop's own details: postal address, phone, the e-mail suppliers reply to and the currency
// its money is shown in (figures stay integer cents). Purchase orders and regrind batches get a
// number counted per shop (a new shop's first order is its number 1), given by a trigger from a
// counter on the shop's row so that two orders at once never share one, and the shop's address
// as it was when they were sent.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table shops add column address text not null default '' check (length(address) <= 500);
    alter table shops add column phone text check (length(phone) <= 40);
    alter table shops add column reply_email text check (reply_email is null or (position('@' in reply_email) > 1 and length(reply_email) <= 254));
    alter table shops add column currency text not null default 'USD' check (currency in ('USD', 'CAD', 'EUR', 'GBP', 'AUD'));
    alter table shops add column last_order_number integer not null default 0;
    alter table shops add column last_batch_number integer not null default 0;

    alter table purchase_orders add column number integer;
    alter table purchase_orders add column ship_to text;
    update purchase_orders o set number = n.number
      from (select id, row_number() over (partition by shop_id order by id) as number from purchase_orders) n where n.id = o.id;
    alter table purchase_orders alter column number set not null;
    alter table purchase_orders add constraint purchase_orders_shop_id_number_key unique (shop_id, number);
    update shops s set last_order_number = coalesce((select max(number) from purchase_orders o where o.shop_id = s.id), 0);

    alter table regrind_batches add column number integer;
    alter table regrind_batches add column ship_to text;
    update regrind_batches b set number = n.number
      from (select id, row_number() over (partition by shop_id order by id) as number from regrind_batches) n where n.id = b.id;
    alter table regrind_batches alter column number set not null;
    alter table regrind_batches add constraint regrind_batches_shop_id_number_key unique (shop_id, number);
    update shops s set last_batch_number = coalesce((select max(number) from regrind_batches b where b.shop_id = s.id), 0);

    create function number_purchase_order() returns trigger language plpgsql as $$
    begin
      update shops set last_order_number = last_order_number + 1 where id = new.shop_id returning last_order_number into new.number;
      return new;
    end $$;
    create trigger purchase_orders_number before insert on purchase_orders for each row execute function number_purchase_order();

    create function number_regrind_batch() returns trigger language plpgsql as $$
    begin
      update shops set last_batch_number = last_batch_number + 1 where id = new.shop_id returning last_batch_number into new.number;
      return new;
    end $$;
    create trigger regrind_batches_number before insert on regrind_batches for each row execute function number_regrind_batch();
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop trigger regrind_batches_number on regrind_batches;
    drop function number_regrind_batch();
    drop trigger purchase_orders_number on purchase_orders;
    drop function number_purchase_order();
    alter table regrind_batches drop column ship_to;
    alter table regrind_batches drop column number;
    alter table purchase_orders drop column ship_to;
    alter table purchase_orders drop column number;
    alter table shops drop column last_batch_number;
    alter table shops drop column last_order_number;
    alter table shops drop column currency;
    alter table shops drop column reply_email;
    alter table shops drop column phone;
    alter table shops drop column address;
  `.execute(db)
}
