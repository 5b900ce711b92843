// The length of the shop's shift: the cut form asks before logging more minutes than one shift
// holds (12 hours unless the shop says otherwise).
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`
    alter table shops add column shift_minutes integer not null default 720
      check (shift_minutes between 60 and 1440);
  `.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`alter table shops drop column shift_minutes`.execute(db)
}
