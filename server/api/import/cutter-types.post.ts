// Import cutter types from CSV: a dry run answers the preview and every problem; otherwise all
// rows go in, in one transaction, or none do (400 listing each bad row and column).
import { readCutterTypeCsv, TYPE_COLUMNS } from '#shared/schemas/crib-csv'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readImportBody(event)
  const result = await transaction(async (tx) => {
    const [suppliers, types] = await Promise.all([
      tx.selectFrom('suppliers').select(['id', 'name']).where('shop_id', '=', user.shopId).execute(),
      tx.selectFrom('cutter_types').select('name').where('shop_id', '=', user.shopId).execute(),
    ])
    const read = readCutterTypeCsv(body.csv, {
      suppliers: new Map(suppliers.map((s) => [s.name.toLowerCase(), s.id])),
      takenNames: new Set(types.map((t) => t.name.toLowerCase())),
    })
    if (body.dryRun) return importPreview(TYPE_COLUMNS, read.rows, read.problems)
    if (read.problems.length) rejectImport(read.problems)
    const rows = await withUniqueName('cutter_types', () => tx.insertInto('cutter_types').values(read.values.map((v) => ({
      ...cutterTypeColumns(v), shop_id: user.shopId, name: v.name, profile: v.profile, helix: v.helix, flutes: v.flutes,
      cutting_diameter_mm: v.cuttingDiameterMm, shank_diameter_mm: v.shankDiameterMm, cutting_length_mm: v.cuttingLengthMm,
      overall_length_mm: v.overallLengthMm, rated_life_minutes: v.ratedLifeMinutes, min_usable_diameter_mm: v.minUsableDiameterMm,
      unit_cost_cents: v.unitCostCents,
    }))).returning('id').execute())
    const upload = await storeCsv(tx, { shopId: user.shopId, userId: user.id, csv: body.csv, filename: body.filename })
    return { imported: rows.length, ids: rows.map((r) => r.id), uploadId: upload.id }
  })
  if (!('dryRun' in result)) setResponseStatus(event, 201)
  return result
})
