// Add a cutter type to the catalogue.
import { CutterTypeBody } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readValidatedBody(event, parseWith(CutterTypeBody))
  const db = useDb()
  await assertSupplier(db, user.shopId, body.supplierId)
  await assertNameFree(db, 'cutter_types', user.shopId, body.name)
  const { id } = await withUniqueName('cutter_types', () => db.insertInto('cutter_types')
    .values({ ...cutterTypeColumns(body), shop_id: user.shopId, name: body.name, profile: body.profile, helix: body.helix,
      flutes: body.flutes, cutting_diameter_mm: body.cuttingDiameterMm, shank_diameter_mm: body.shankDiameterMm,
      cutting_length_mm: body.cuttingLengthMm, overall_length_mm: body.overallLengthMm, rated_life_minutes: body.ratedLifeMinutes,
      min_usable_diameter_mm: body.minUsableDiameterMm, unit_cost_cents: body.unitCostCents })
    .returning('id').executeTakeFirstOrThrow())
  setResponseStatus(event, 201)
  return requireCutterType(db, user.shopId, id)
})
