// The shop's machines, with their spindle speed ranges.
export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const rows = await useDb().selectFrom('machines')
    .select(['id', 'name', 'description', 'min_rpm', 'max_rpm', 'tool_changer'])
    .where('shop_id', '=', user.shopId).where('active', '=', true)
    .orderBy('name').execute()
  return rows.map((m) => ({
    id: m.id, name: m.name, description: m.description, minRpm: m.min_rpm, maxRpm: m.max_rpm, toolChanger: m.tool_changer,
  }))
})
