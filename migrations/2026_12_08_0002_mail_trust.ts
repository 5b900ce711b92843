// Mail that cannot be turned against others. A new shop's owner confirms their e-mail address
// before the shop mails anyone else (users.email_confirmed_at, through a 'confirm' link), and
// every mail a shop sends to others is counted (shop_mails) so that an hourly limit holds.
// People who already have a password proved their address (sign-up of old, or an invitation).
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table users add column email_confirmed_at timestamptz;
    update users set email_confirmed_at = coalesce(last_login_at, created_at) where password_hash is not null;
    alter table auth_tokens drop constraint auth_tokens_purpose_check;
    alter table auth_tokens add constraint auth_tokens_purpose_check check (purpose in ('invite', 'reset', 'confirm'));
    create index auth_tokens_user_created_idx on auth_tokens (user_id, purpose, created_at);
    create table shop_mails (
      id bigint generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      kind text not null,
      recipients integer not null check (recipients > 0),
      sent_at timestamptz not null default now()
    );
    create index shop_mails_shop_idx on shop_mails (shop_id, sent_at);
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop table shop_mails;
    drop index auth_tokens_user_created_idx;
    delete from auth_tokens where purpose = 'confirm';
    alter table auth_tokens drop constraint auth_tokens_purpose_check;
    alter table auth_tokens add constraint auth_tokens_purpose_check check (purpose in ('invite', 'reset'));
    alter table users drop column email_confirmed_at;
  `.execute(db)
}
