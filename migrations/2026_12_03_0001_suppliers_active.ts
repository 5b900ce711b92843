// Suppliers can be archived like cutter types: a supplier the shop no longer buys from stays on
// its old orders and types but leaves the pick lists.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`alter table suppliers add column active boolean not null default true`.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`alter table suppliers drop column active`.execute(db)
}
