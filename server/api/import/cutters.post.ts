// Import cutters the shop already has (from a spreadsheet or an older system): each gets a fresh
// label code through createCutters, and the answer names them for the label sheet. All rows or none.
import { CUTTER_COLUMNS, readCutterCsv } from '#shared/schemas/crib-csv'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readImportBody(event)
  const result = await transaction(async (tx) => {
    const [types, shop] = await Promise.all([
      tx.selectFrom('cutter_types').select(['id', 'name', 'cutting_diameter_mm', 'max_regrinds', 'active'])
        .where('shop_id', '=', user.shopId).execute(),
      tx.selectFrom('shops').select('regrind_life_fraction').where('id', '=', user.shopId).executeTakeFirstOrThrow(),
    ])
    const read = readCutterCsv(body.csv, new Map(types.map((t) => [t.name.toLowerCase(), {
      id: t.id, name: t.name, cuttingDiameterMm: t.cutting_diameter_mm, maxRegrinds: t.max_regrinds, active: t.active,
    }])))
    if (body.dryRun) return importPreview(CUTTER_COLUMNS, read.rows, read.problems)
    if (read.problems.length) rejectImport(read.problems)
    const upload = await storeCsv(tx, { shopId: user.shopId, userId: user.id, csv: body.csv, filename: body.filename })
    const created = await createCutters(tx, user.shopId, user.id, read.values.map((v) => ({
      typeId: v.typeId,
      diameterMm: v.diameterMm,
      status: v.status,
      regrindCount: v.regrindCount,
      lifeUsed: v.lifeUsed,
      // A reground cutter is on a shorter life, as if the crib had reground it (DEVELOPERS.md).
      lifeScale: v.regrindCount > 0 ? shop.regrind_life_fraction : 1,
      note: `Imported from CSV (upload ${upload.id}, row ${v.row})${v.note ? `: ${v.note}` : ''}`,
    })))
    return { imported: created.length, ids: created.map((c) => c.id), codes: created.map((c) => c.code), uploadId: upload.id }
  })
  if (!('dryRun' in result)) setResponseStatus(event, 201)
  return result
})
