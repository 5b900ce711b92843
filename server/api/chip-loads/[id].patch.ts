// The crib manager changes one row of the chip-load table. Only the figures and their source
// change; the band's diameters stay, so that the bands never overlap or leave a gap.
import { ChipLoadIdParams, ChipLoadPatchBody } from '#shared/schemas/feeds'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(ChipLoadIdParams))
  const b = await readValidatedBody(event, parseWith(ChipLoadPatchBody))
  const db = useDb()
  const row = await db.selectFrom('chip_loads').select(['chip_load_min_mm', 'chip_load_max_mm'])
    .where('shop_id', '=', user.shopId).where('id', '=', id).executeTakeFirst()
  if (!row) notFound('chip-load row')
  // Checked against the stored figure when only one end of the range is sent.
  const min = b.chipLoadMinMm ?? row.chip_load_min_mm
  const max = b.chipLoadMaxMm ?? row.chip_load_max_mm
  if (min > max) {
    const field = b.chipLoadMaxMm === undefined ? 'chipLoadMinMm' : 'chipLoadMaxMm'
    fieldError({ [field]: 'the smallest chip load must not be more than the largest' }, {
      message: `${field}: the smallest chip load must not be more than the largest (${min} mm > ${max} mm).`,
    })
  }
  await db.updateTable('chip_loads').set({
    chip_load_min_mm: min,
    chip_load_max_mm: max,
    ...(b.surfaceSpeedMPerMin !== undefined && { surface_speed_m_per_min: b.surfaceSpeedMPerMin }),
    ...(b.plungeFraction !== undefined && { plunge_fraction: b.plungeFraction }),
    ...(b.depthPerPassFactor !== undefined && { depth_per_pass_factor: b.depthPerPassFactor }),
    ...(b.source !== undefined && { source: b.source }),
    updated_by: user.id,
    updated_at: new Date(),
  }).where('shop_id', '=', user.shopId).where('id', '=', id).execute()
  return (await chipLoadRows(db, user.shopId)).find((r) => r.id === id)
})
