// Which cutters a label sheet prints, chosen by id list, by cutter type (its stock) or by the
// purchase order they came in on, always within one shop; and the sheet itself: for each cutter
// its code, the URL its QR code opens, the type in short and the QR code as SVG, so that the
// sheet needs no further requests.
import QRCode from 'qrcode'
import { cutterPageUrl, typeShort } from '#shared/kerf/labels'
import { QR_QUIET_MODULES } from '#shared/kerf/label-sizes'
import { MAX_LABELS } from '#shared/schemas/labels'
import type { Queryable } from '../../db/connect'
import type { SessionUser } from '../platform/auth'

export type LabelSelector = { ids: number[] } | { typeId: number } | { orderId: number }

/** Cutters that still exist on the shelf or in a machine: the only ones worth a new label. */
const GONE = ['retired', 'lost'] as const

export async function loadLabelCutters(db: Queryable, shopId: number, selector: LabelSelector) {
  const cutters = db.selectFrom('cutters as c')
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .select(['c.id', 'c.code', 't.name as typeName', 't.cutting_diameter_mm', 't.profile', 't.v_angle_deg', 't.flutes', 't.helix'])
    .where('c.shop_id', '=', shopId)

  if ('ids' in selector) {
    const rows = await cutters.where('c.id', 'in', selector.ids).execute()
    // Every asked-for cutter or none: a sheet silently short of one label is worse than an error.
    if (rows.length !== selector.ids.length) notFound('cutter')
    const byId = new Map(rows.map((r) => [r.id, r]))
    return {
      title: rows.length === 1 ? `Cutter ${rows[0]!.code}` : `${rows.length} cutters`,
      rows: selector.ids.map((id) => byId.get(id)!),
    }
  }

  if ('typeId' in selector) {
    const type = await db.selectFrom('cutter_types').select('name')
      .where('id', '=', selector.typeId).where('shop_id', '=', shopId).executeTakeFirst()
    if (!type) notFound('cutter type')
    const rows = await cutters.where('c.type_id', '=', selector.typeId).where('c.status', 'not in', GONE)
      .orderBy('c.id').limit(MAX_LABELS + 1).execute()
    return { title: type.name, rows: atMostMax(rows) }
  }

  const order = await db.selectFrom('purchase_orders as o')
    .leftJoin('suppliers as s', (j) => j.onRef('s.id', '=', 'o.supplier_id').onRef('s.shop_id', '=', 'o.shop_id'))
    .select(['o.id', 's.name as supplierName'])
    .where('o.id', '=', selector.orderId).where('o.shop_id', '=', shopId).executeTakeFirst()
  if (!order) notFound('purchase order')
  const rows = await cutters
    .innerJoin('purchase_order_lines as l', (j) => j.onRef('l.id', '=', 'c.order_line_id').onRef('l.shop_id', '=', 'c.shop_id'))
    .where('l.order_id', '=', selector.orderId).where('c.status', 'not in', GONE)
    .orderBy('t.name').orderBy('c.id').limit(MAX_LABELS + 1).execute()
  return { title: `Purchase order ${order.id}${order.supplierName ? ` from ${order.supplierName}` : ''}`, rows: atMostMax(rows) }
}

function atMostMax<T>(rows: T[]): T[] {
  if (rows.length > MAX_LABELS) {
    throw createError({ statusCode: 400, statusMessage: `That is more than ${MAX_LABELS} cutters. Print at most ${MAX_LABELS} labels at a time: pick cutters by id instead.` })
  }
  return rows
}

export async function labelSheet(db: Queryable, user: SessionUser, selector: LabelSelector, base: string) {
  const { title, rows } = await loadLabelCutters(db, user.shopId, selector)
  const labels = await Promise.all(rows.map(async (c) => {
    const url = cutterPageUrl(base, c.code)
    return {
      id: c.id,
      code: c.code,
      url,
      typeName: c.typeName,
      short: typeShort({ cuttingDiameterMm: c.cutting_diameter_mm, profile: c.profile, vAngleDeg: c.v_angle_deg, flutes: c.flutes, helix: c.helix }, user.lengthUnit),
      // Each with its quiet zone of four modules inside the drawing, so that no layout can crowd it.
      qrSvg: await QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'M', margin: QR_QUIET_MODULES }),
      // The smallest label's: fewer modules, each larger on 18 mm.
      qrSvgLow: await QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'L', margin: QR_QUIET_MODULES }),
    }
  }))
  return { title, labels }
}
