// Change some fields of a cutter type, or archive it ({ active: false }) and restore it. Types
// are never deleted: their cutters, logs and orders keep pointing at them.
import { CutterTypeUpdateBody, geometryProblems, IdParams } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  const body = await readValidatedBody(event, parseWith(CutterTypeUpdateBody))
  await transaction(async (tx) => {
    const row = await tx.selectFrom('cutter_types').selectAll()
      .where('shop_id', '=', user.shopId).where('id', '=', id).forUpdate().executeTakeFirst()
    if (!row) notFound('cutter type')
    // The rules between fields hold for the row as it will be, not only for the fields sent.
    badFields(geometryProblems({
      profile: body.profile ?? row.profile,
      vAngleDeg: body.vAngleDeg !== undefined ? body.vAngleDeg : body.profile && body.profile !== 'v_bit' ? null : row.v_angle_deg,
      cuttingDiameterMm: body.cuttingDiameterMm ?? row.cutting_diameter_mm,
      minUsableDiameterMm: body.minUsableDiameterMm ?? row.min_usable_diameter_mm,
      cuttingLengthMm: body.cuttingLengthMm ?? row.cutting_length_mm,
      overallLengthMm: body.overallLengthMm ?? row.overall_length_mm,
      minOnHand: body.minOnHand !== undefined ? body.minOnHand : row.min_on_hand,
      maxOnHand: body.maxOnHand !== undefined ? body.maxOnHand : row.max_on_hand,
    }))
    await assertSupplier(tx, user.shopId, body.supplierId)
    if (body.name !== undefined) await assertNameFree(tx, 'cutter_types', user.shopId, body.name, id)
    const columns = cutterTypeColumns(body)
    // Choosing another profile than V-bit takes the angle away with it.
    if (body.profile && body.profile !== 'v_bit' && body.vAngleDeg === undefined) columns.v_angle_deg = null
    const changes = { ...columns, active: body.active }
    if (Object.values(changes).every((v) => v === undefined)) return // nothing to change: no empty UPDATE
    await withUniqueName('cutter_types', () => tx.updateTable('cutter_types').set(changes)
      .where('shop_id', '=', user.shopId).where('id', '=', id)
      .execute())
  })
  return requireCutterType(useDb(), user.shopId, id)
})
