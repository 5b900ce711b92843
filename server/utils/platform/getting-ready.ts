// Which of the getting-ready steps (shared/kerf/getting-ready.ts) a shop has done, read from its
// own rows in one query. Nothing new is stored: each step is ticked by the row it leaves behind.
import { sql } from 'kysely'
import { GETTING_READY_STEPS, type GettingReadyKey, type GettingReadyStep } from '#shared/kerf/getting-ready'
import type { Role } from '#shared/kerf/roles'
import type { Queryable } from '../../db/connect'

export async function gettingReady(db: Queryable, shopId: number, role: Role): Promise<{ steps: GettingReadyStep[], done: boolean }> {
  const row = await db.selectFrom('shops as s')
    .select([
      sql<boolean>`exists (select 1 from machines m where m.shop_id = s.id and m.active)`.as('machine'),
      // Sign-up writes the starting materials in the shop's own transaction, so their created_at is
      // the shop's. The materials count as checked once the shop has an active material and has
      // either added one of its own since (a later created_at) or logged a cut on one (it found
      // what it cuts on the list). An edit of a starting material leaves no trace to read, and a
      // mere visit to the page says nothing, so neither ticks it.
      sql<boolean>`exists (select 1 from materials m where m.shop_id = s.id and m.active)
        and (exists (select 1 from materials m where m.shop_id = s.id and m.created_at > s.created_at)
          or exists (select 1 from cut_logs l where l.shop_id = s.id and l.voided_at is null))`.as('materials'),
      sql<boolean>`exists (select 1 from suppliers p where p.shop_id = s.id and p.active)`.as('supplier'),
      sql<boolean>`exists (select 1 from cutter_types t where t.shop_id = s.id and t.active)`.as('cutterType'),
      // Labels: the app does not record that a sheet was printed (the label pages only render),
      // so cutters on the books tick this step; receiving them is what offers their label sheet.
      sql<boolean>`exists (select 1 from cutters c where c.shop_id = s.id)`.as('stock'),
      // An operator invited (no password yet) counts as well as one who has joined; one switched off does not.
      sql<boolean>`exists (select 1 from users u where u.shop_id = s.id and u.role = 'operator' and u.active)`.as('operator'),
      sql<boolean>`exists (select 1 from cut_logs l where l.shop_id = s.id and l.voided_at is null)`.as('firstCut'),
    ])
    .where('s.id', '=', shopId)
    // The shop is the session's own, so its row is there.
    .executeTakeFirstOrThrow()
  const done = row as Record<GettingReadyKey, boolean>
  const steps = GETTING_READY_STEPS.map((s) => ({
    ...s,
    // Only owners invite people by e-mail; a crib manager adds operators by name, with a PIN for the shop's devices.
    to: s.key === 'operator' && role !== 'owner' ? '/crib/devices' : s.to,
    done: Boolean(done[s.key]),
  }))
  return { steps, done: steps.every((s) => s.done) }
}
