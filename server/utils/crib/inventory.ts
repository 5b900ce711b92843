// The crib's inventory list: one shop's cutters filtered, sorted and paged in SQL, with the
// due rule of shared/kerf/due.ts applied to each row of the page.
import { sql, type Expression } from 'kysely'
import { dueAction, dueReason, DUE_STATUSES } from '#shared/kerf/due'
import { CUTTER_STATUSES } from '#shared/kerf/status'
import type { InventoryFilter, InventorySortField } from '#shared/schemas/inventory'
import type { Queryable } from '../../db/connect'

/** Escapes LIKE's wildcards so a typed % or _ matches itself. */
const likeText = (s: string) => s.replace(/[\\%_]/g, (ch) => `\\${ch}`)

/** The shop's cutters that pass the filters; the count needs no join, so none is made here. */
function filtered(db: Queryable, shopId: number, f: InventoryFilter, threshold: number) {
  let q = db.selectFrom('cutters as c').where('c.shop_id', '=', shopId)
  if (f.status?.length) q = q.where('c.status', 'in', f.status)
  if (f.typeId !== undefined) q = q.where('c.type_id', '=', f.typeId)
  if (f.machineId !== undefined) q = q.where('c.machine_id', '=', f.machineId)
  if (f.lifeMin !== undefined) q = q.where('c.life_used', '>=', f.lifeMin)
  if (f.lifeMax !== undefined) q = q.where('c.life_used', '<', f.lifeMax)
  if (f.q) {
    // Label codes are stored in capitals; type names are matched anywhere, in any case.
    const code = `${likeText(f.q.toUpperCase().replace(/[\s-]/g, ''))}%`
    const name = `%${likeText(f.q)}%`
    q = q.where((eb) => eb.or([
      eb('c.code', 'like', code),
      eb('c.type_id', 'in', eb.selectFrom('cutter_types').select('id').where('shop_id', '=', shopId).where('name', 'ilike', name)),
    ]))
  }
  if (f.due !== undefined) {
    q = q.where((eb) => {
      const due = eb.and([
        eb('c.status', 'in', [...DUE_STATUSES]),
        // Not "= 'dull'": an unflagged cutter's null would make the negation unknown and drop it.
        eb.or([eb('c.flagged', 'is not distinct from', 'dull'), eb('c.life_used', '>=', threshold)]),
      ])
      return f.due ? due : eb.not(due)
    })
  }
  return q
}

const SORT_COLUMNS: Record<InventorySortField, Expression<unknown>> = {
  code: sql.ref('c.code'),
  type: sql.ref('t.name'),
  // The order a cutter's life goes through, not the alphabet.
  status: sql`array_position(array[${sql.join(CUTTER_STATUSES.map((s) => sql.lit(s)))}]::text[], c.status)`,
  machine: sql.ref('m.name'),
  lifeUsed: sql.ref('c.life_used'),
  minutesTotal: sql.ref('c.minutes_total'),
  regrindCount: sql.ref('c.regrind_count'),
  diameterMm: sql.ref('c.diameter_mm'),
  receivedAt: sql.ref('c.received_at'),
  updatedAt: sql.ref('c.updated_at'),
}

/** ORDER BY for the page: the chosen column, then the id so that pages are stable among equals.
 *  Only the machine can be null (cutters without one sort last both ways); elsewhere a plain
 *  direction lets the (shop_id, life_used desc) and (shop_id, code) indexes serve. */
function orderTerms(f: InventoryFilter) {
  const column = SORT_COLUMNS[f.sort.field]
  const dir = f.sort.desc ? 'desc' : 'asc'
  return [
    sql`${column} ${sql.raw(dir)}${sql.raw(f.sort.field === 'machine' ? ' nulls last' : '')}`,
    sql`c.id ${sql.raw(dir)}`,
  ] as const
}

export async function listInventory(db: Queryable, shopId: number, f: InventoryFilter) {
  const shop = await db.selectFrom('shops').select(['life_threshold']).where('id', '=', shopId).executeTakeFirstOrThrow()
  const threshold = shop.life_threshold
  const order = orderTerms(f)

  // The page's ids are found on narrow rows (id and sort key), joined only where the sort needs
  // it; the 50 wide rows are read after. Deep pages then sort in memory instead of on disk.
  let ids = filtered(db, shopId, f, threshold)
  // The joins add only the sort key's table; the cast keeps the filtered builder's type.
  if (f.sort.field === 'type') {
    ids = ids.innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id')) as unknown as typeof ids
  }
  if (f.sort.field === 'machine') {
    ids = ids.leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'c.machine_id').onRef('m.shop_id', '=', 'c.shop_id')) as unknown as typeof ids
  }
  const pageIds = ids.select('c.id').orderBy(order[0]).orderBy(order[1]).limit(f.pageSize).offset((f.page - 1) * f.pageSize)

  const [rows, count] = await Promise.all([
    db.selectFrom('cutters as c')
      .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
      .leftJoin('machines as m', (j) => j.onRef('m.id', '=', 'c.machine_id').onRef('m.shop_id', '=', 'c.shop_id'))
      .select([
        'c.id', 'c.code', 'c.status', 'c.type_id', 'c.machine_id', 'c.life_used', 'c.minutes_total', 'c.regrind_count',
        'c.diameter_mm', 'c.flagged', 'c.retired_reason', 'c.received_at', 'c.updated_at',
        't.name as type_name', 't.max_regrinds', 't.regrind_diameter_loss_mm', 't.min_usable_diameter_mm', 'm.name as machine_name',
      ])
      .where('c.shop_id', '=', shopId)
      .where('c.id', 'in', pageIds)
      .orderBy(order[0]).orderBy(order[1])
      .execute(),
    filtered(db, shopId, f, threshold)
      .select((eb) => eb.fn.countAll<number>().as('n'))
      .executeTakeFirstOrThrow(),
  ])

  return {
    total: Number(count.n),
    lifeThreshold: threshold,
    rows: rows.map((c) => {
      const forDue = { status: c.status, lifeUsed: c.life_used, flagged: c.flagged, regrindCount: c.regrind_count, diameterMm: c.diameter_mm }
      const reason = dueReason(forDue, threshold)
      return {
        id: c.id,
        code: c.code,
        status: c.status,
        typeId: c.type_id,
        typeName: c.type_name,
        machineId: c.machine_id,
        machineName: c.machine_name,
        lifeUsed: c.life_used,
        minutesTotal: c.minutes_total,
        regrindCount: c.regrind_count,
        diameterMm: c.diameter_mm,
        flagged: c.flagged,
        retiredReason: c.retired_reason,
        receivedAt: c.received_at,
        updatedAt: c.updated_at,
        due: reason && {
          reason,
          action: dueAction(forDue, {
            maxRegrinds: c.max_regrinds, regrindDiameterLossMm: c.regrind_diameter_loss_mm, minUsableDiameterMm: c.min_usable_diameter_mm,
          }),
        },
      }
    }),
  }
}
