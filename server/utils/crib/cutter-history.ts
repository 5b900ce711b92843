// One cutter's history for the crib: its events and its cut logs merged into one timeline,
// newest first, with who and where. A cut's own 'cut_logged' event is left out: the cut log
// says the same with more detail.
import { sql } from 'kysely'
import type { CutOutcome, CutterEventKind, CutterStatus } from '../../db/schema'
import type { Queryable } from '../../db/connect'

interface HistoryRow {
  source: 'event' | 'cut'
  id: number
  at: Date
  kind: CutterEventKind | null
  from_status: CutterStatus | null
  to_status: CutterStatus | null
  machine_name: string | null
  who: string | null
  photo_id: number | null
  note: string
  material_name: string | null
  minutes: number | null
  outcome: CutOutcome | null
  rpm: number | null
  feed_mm_per_min: number | null
  life_added: number | null
  logged_at: Date | null
  voided: boolean | null
}

export async function cutterHistory(db: Queryable, shopId: number, cutterId: number, page: number, pageSize: number) {
  const cutter = await db.selectFrom('cutters').select('id').where('shop_id', '=', shopId).where('id', '=', cutterId).executeTakeFirst()
  if (!cutter) notFound('cutter')

  // Both halves use their (cutter_id, time desc) index; the union is one cutter's rows only.
  const [page_, events, cuts] = await Promise.all([
    sql<HistoryRow>`
      select 'event' as source, e.id, e.created_at as at, e.kind, e.from_status, e.to_status, m.name as machine_name,
        u.name as who, e.photo_id, e.note, null as material_name, null::numeric as minutes, null as outcome,
        null::integer as rpm, null::numeric as feed_mm_per_min, null::numeric as life_added, null::timestamptz as logged_at,
        null::boolean as voided
      from cutter_events e
      left join users u on u.id = e.actor_id and u.shop_id = e.shop_id
      left join machines m on m.id = e.machine_id and m.shop_id = e.shop_id
      where e.shop_id = ${shopId} and e.cutter_id = ${cutterId} and e.kind <> 'cut_logged'
      union all
      select 'cut', l.id, l.cut_at, null, null, null, m.name, u.name, null, l.note, mt.name, l.minutes, l.outcome,
        l.rpm, l.feed_mm_per_min, l.life_added, l.created_at, l.voided_at is not null
      from cut_logs l
      join materials mt on mt.id = l.material_id and mt.shop_id = l.shop_id
      left join users u on u.id = l.operator_id and u.shop_id = l.shop_id
      left join machines m on m.id = l.machine_id and m.shop_id = l.shop_id
      where l.shop_id = ${shopId} and l.cutter_id = ${cutterId}
      order by at desc, source desc, id desc
      limit ${pageSize} offset ${(page - 1) * pageSize}
    `.execute(db),
    db.selectFrom('cutter_events').select((eb) => eb.fn.countAll<number>().as('n'))
      .where('shop_id', '=', shopId).where('cutter_id', '=', cutterId).where('kind', '!=', 'cut_logged')
      .executeTakeFirstOrThrow(),
    db.selectFrom('cut_logs').select((eb) => eb.fn.countAll<number>().as('n'))
      .where('shop_id', '=', shopId).where('cutter_id', '=', cutterId)
      .executeTakeFirstOrThrow(),
  ])

  return {
    total: Number(events.n) + Number(cuts.n),
    page,
    pageSize,
    entries: page_.rows.map((r) => r.source === 'event'
      ? {
          source: 'event' as const, id: `e${r.id}`, at: r.at, who: r.who, machineName: r.machine_name, note: r.note,
          kind: r.kind!, fromStatus: r.from_status, toStatus: r.to_status, photoId: r.photo_id,
        }
      : {
          source: 'cut' as const, id: `c${r.id}`, at: r.at, who: r.who, machineName: r.machine_name, note: r.note,
          materialName: r.material_name!, minutes: r.minutes!, outcome: r.outcome!, rpm: r.rpm, feedMmPerMin: r.feed_mm_per_min,
          lifeAdded: r.life_added!, loggedAt: r.logged_at!, voided: r.voided === true,
        }),
  }
}
