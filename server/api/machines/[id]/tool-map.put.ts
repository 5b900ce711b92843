// Replace the machine's tool-number → pocket map: for a shop whose programs call tools by numbers
// other than the pockets they sit in. One row a tool; pockets within the machine's count.
import { IdParams } from '#shared/schemas/crib'
import { ToolMapBody } from '#shared/schemas/programs'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  const { map } = await readValidatedBody(event, parseWith(ToolMapBody))
  const seen = new Set<number>()
  for (const [i, row] of map.entries()) {
    if (seen.has(row.tool)) badField(`map.${i}.tool`, `T${row.tool} is mapped twice`)
    seen.add(row.tool)
  }
  await transaction(async (tx) => {
    const machine = await lockMachine(tx, user.shopId, id)
    for (const [i, row] of map.entries()) {
      if (row.pocket > machine.pockets) badField(`map.${i}.pocket`, machine.pockets ? `${machine.name} has pockets 1 to ${machine.pockets}` : `${machine.name} has no tool changer`)
    }
    await tx.deleteFrom('machine_tool_pockets').where('shop_id', '=', user.shopId).where('machine_id', '=', id).execute()
    if (map.length) {
      await tx.insertInto('machine_tool_pockets').values(map.map((r) => ({ shop_id: user.shopId, machine_id: id, tool: r.tool, pocket: r.pocket }))).execute()
    }
  })
  const saved = await toolMapOf(useDb(), user.shopId, id)
  return { map: [...saved].map(([tool, pocket]) => ({ tool, pocket })) }
})
