// Operators on a shared shop device. A crib manager or owner enrols a browser as one of the
// shop's devices: the browser keeps a random token in an HttpOnly cookie and the database only
// its SHA-256, so a leaked table opens nothing. On an enrolled device an operator signs in by
// name and a 4- to 8-digit PIN (users.pin_hash, hashed as passwords are). A session started
// that way names its device (user_sessions.device_id), so revoking the device ends its sessions.
// Operators without a company e-mail can be added by name only: users.email becomes nullable.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create table shop_devices (
      id integer generated always as identity primary key,
      shop_id integer not null references shops(id) on delete cascade,
      name text not null check (length(name) between 1 and 60),
      token_hash text not null unique,
      enrolled_by integer references users(id) on delete set null,
      created_at timestamptz not null default now(),
      last_used_at timestamptz,
      revoked_at timestamptz,
      revoked_by integer references users(id) on delete set null,
      unique (shop_id, id)
    );
    -- Two live devices of one shop never share a name, in any case.
    create unique index shop_devices_live_name_key on shop_devices (shop_id, lower(name)) where revoked_at is null;
    alter table users add column pin_hash text;
    alter table users alter column email drop not null;
    alter table user_sessions add column device_id integer references shop_devices(id) on delete cascade;
    create index user_sessions_device_idx on user_sessions (device_id) where device_id is not null;
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`
    drop index user_sessions_device_idx;
    delete from user_sessions where device_id is not null;
    alter table user_sessions drop column device_id;
    -- People added by name only get an address nobody can receive mail at (RFC 2606's .invalid).
    update users set email = 'no-email-' || id || '@example.invalid' where email is null;
    alter table users alter column email set not null;
    alter table users drop column pin_hash;
    drop table shop_devices;
  `.execute(db)
}
