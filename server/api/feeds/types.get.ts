// The cutter types the feeds calculator can pick from, with the geometry it shows beside each.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const rows = await useDb().selectFrom('cutter_types')
    .select(['id', 'name', 'flutes', 'cutting_diameter_mm', 'helix', 'profile'])
    .where('shop_id', '=', user.shopId).where('active', '=', true)
    .orderBy('cutting_diameter_mm').orderBy('name').execute()
  return rows.map((t) => ({ id: t.id, name: t.name, flutes: t.flutes, cuttingDiameterMm: t.cutting_diameter_mm, helix: t.helix, profile: t.profile }))
})
