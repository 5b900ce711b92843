// Sessions that can end. A sealed cookie names its session row; every request reads the row with
// the person, so signing out deletes one row and ending a person's sessions (password change or
// reset, a role change, switching the account off, "sign out everywhere") deletes all of theirs,
// on every app instance at once.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    create table user_sessions (
      id uuid primary key default gen_random_uuid(),
      user_id integer not null references users(id) on delete cascade,
      created_at timestamptz not null default now(),
      expires_at timestamptz not null
    );
    create index user_sessions_user_idx on user_sessions (user_id);
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop table user_sessions`.execute(db)
}
