// One record of every kind a route can name by id, in chosen states, written straight into a
// test shop: what the tenancy and hostile-input tests aim their requests at.
import { randomUUID } from 'node:crypto'
import { appDb } from './db'
import { addRegrindFixture } from './regrind'

export interface ShopRecords {
  supplierId: number
  machineId: number
  materialId: number
  typeId: number
  chipLoadId: number
  /** Cutters by state: in the crib, in a machine, lost, flagged dull, out for resharpening. */
  cutters: { crib: { id: number, code: string }, spindle: { id: number, code: string }, lost: { id: number, code: string },
    dull: { id: number, code: string }, away: { id: number, code: string } }
  draftOrderId: number
  sentOrder: { id: number, lineId: number }
  draftBatchId: number
  sentBatch: { id: number, cutterId: number }
  reportId: number
  uploadId: number
  /** An NC program calling T1, read at the default machine settings. */
  programId: number
  /** A cut logged by the owner on the cutter in the machine. */
  cutLogId: number
  /** An enrolled shop device (its token is nobody's: only its hash is stored). */
  deviceId: number
}

export async function addShopRecords(shopId: number, ownerId: number): Promise<ShopRecords> {
  const fixture = await addRegrindFixture(shopId, `regrind-${randomUUID().slice(0, 8)}@example.com`)
  const [crib, spindle, lost, dull, away] = await fixture.add([
    { status: 'in_crib' }, { status: 'in_spindle' }, { status: 'lost' }, { status: 'in_crib', flagged: 'dull', lifeUsed: 0.5 },
    { status: 'at_regrind' },
  ])
  const db = appDb()
  try {
    const material = await db.selectFrom('materials').select('id').where('shop_id', '=', shopId).orderBy('id').executeTakeFirstOrThrow()
    const chipLoad = await db.selectFrom('chip_loads').select('id').where('shop_id', '=', shopId).orderBy('id').executeTakeFirstOrThrow()
    const [draft, sent] = await db.insertInto('purchase_orders').values([
      { shop_id: shopId, supplier_id: fixture.supplier.id, created_by: ownerId, status: 'draft' },
      { shop_id: shopId, supplier_id: fixture.supplier.id, created_by: ownerId, status: 'sent', sent_at: new Date() },
    ]).returning('id').execute()
    const [, sentLine] = await db.insertInto('purchase_order_lines').values([
      { shop_id: shopId, order_id: draft!.id, type_id: fixture.typeId, quantity: 4, unit_cost_cents: 3900 },
      { shop_id: shopId, order_id: sent!.id, type_id: fixture.typeId, quantity: 4, unit_cost_cents: 3900 },
    ]).returning('id').execute()
    const [draftBatch, sentBatch] = await db.insertInto('regrind_batches').values([
      { shop_id: shopId, supplier_id: fixture.supplier.id, created_by: ownerId, status: 'draft' },
      { shop_id: shopId, supplier_id: fixture.supplier.id, created_by: ownerId, status: 'sent', sent_at: new Date() },
    ]).returning('id').execute()
    await db.insertInto('regrind_batch_items').values([
      { shop_id: shopId, batch_id: draftBatch!.id, cutter_id: dull!.id, diameter_before_mm: 6.35 },
      { shop_id: shopId, batch_id: sentBatch!.id, cutter_id: away!.id, diameter_before_mm: 6.35 },
    ]).execute()
    const report = await db.insertInto('tooling_reports').values({
      shop_id: shopId, report_date: '2026-01-05', status: 'sent', manual: true, subject: 'Tooling report', sent_at: new Date(),
    }).returning('id').executeTakeFirstOrThrow()
    const upload = await db.insertInto('uploads').values({
      shop_id: shopId, storage_key: `photos/${shopId}/${randomUUID()}.png`, kind: 'photo', content_type: 'image/png', size_bytes: 1,
      uploaded_by: ownerId,
    }).returning('id').executeTakeFirstOrThrow()
    const cutLog = await db.insertInto('cut_logs').values({
      shop_id: shopId, cutter_id: spindle!.id, machine_id: fixture.machineId, operator_id: ownerId, material_id: material.id,
      minutes: 12, wear_factor: 1, life_added: 0.02, outcome: 'clean', idempotency_key: `records-${randomUUID()}`,
    }).returning('id').executeTakeFirstOrThrow()
    const tool = { tool: 1, feedDistanceMm: 100, plungeDistanceMm: 5, feedMinutes: 0.1, estimatedMinutes: 0.12, rapidMinutes: 0.01, maxDepthMm: 5, spindleRpm: [18000], feedsMmPerMin: [1000] }
    const program = await db.insertInto('nc_programs').values({
      shop_id: shopId, name: 'Records program', size_bytes: 40, storage_key: `programs/${shopId}/${randomUUID()}.nc`, units: 'mm',
      tools: JSON.stringify([tool]), estimates: JSON.stringify({ '1000/10000': [{ tool: 1, estimatedMinutes: 0.12, rapidMinutes: 0.01 }] }),
      tool_count: 1, total_minutes: 0.12, line_count: 5, uploaded_by: ownerId,
    }).returning('id').executeTakeFirstOrThrow()
    const device = await db.insertInto('shop_devices').values({
      shop_id: shopId, name: `Records tablet ${randomUUID().slice(0, 8)}`, token_hash: randomUUID(), enrolled_by: ownerId,
    }).returning('id').executeTakeFirstOrThrow()
    return {
      deviceId: device.id,
      programId: program.id,
      cutLogId: Number(cutLog.id),
      supplierId: fixture.supplier.id, machineId: fixture.machineId, materialId: material.id, typeId: fixture.typeId, chipLoadId: chipLoad.id,
      cutters: { crib: crib!, spindle: spindle!, lost: lost!, dull: dull!, away: away! },
      draftOrderId: draft!.id, sentOrder: { id: sent!.id, lineId: sentLine!.id },
      draftBatchId: draftBatch!.id, sentBatch: { id: sentBatch!.id, cutterId: away!.id },
      reportId: report.id, uploadId: upload.id,
    }
  } finally {
    await db.destroy()
  }
}
