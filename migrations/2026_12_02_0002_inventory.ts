// The crib's inventory lists a shop's cutters by label code by default, and pages through them.
// The global unique index on code cannot walk one shop's codes in order: with several shops the
// planner filters the others' rows out or sorts the whole shop. This index walks them directly.
import { sql, type Kysely } from 'kysely'

export async function up(db: Kysely<any>): Promise<void> {
  await sql`create index cutters_shop_code_idx on cutters (shop_id, code)`.execute(db)
}

export async function down(db: Kysely<any>): Promise<void> {
  await sql`drop index if exists cutters_shop_code_idx`.execute(db)
}
