// The shop's materials with family and wear factor, the common ones first.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const rows = await useDb().selectFrom('materials')
    .select(['id', 'name', 'family', 'wear_factor', 'common'])
    .where('shop_id', '=', user.shopId).where('active', '=', true)
    .orderBy('common', 'desc').orderBy('name').execute()
  return rows.map((m) => ({ id: m.id, name: m.name, family: m.family, wearFactor: m.wear_factor, common: m.common }))
})
