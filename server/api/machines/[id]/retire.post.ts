// Retire a machine: it leaves the load and feeds pick lists, and its logs keep it. A machine that
// still holds cutters answers 409 naming them; they are returned first.
import { IdParams } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  await transaction(async (tx) => {
    const machine = await lockMachine(tx, user.shopId, id)
    if (!machine.active) return // retired already: a repeat is harmless
    const held = await tx.selectFrom('cutters').select('code')
      .where('shop_id', '=', user.shopId).where('machine_id', '=', id).where('status', '=', 'in_spindle').orderBy('code').execute()
    if (held.length) {
      throw createError({
        statusCode: 409,
        statusMessage: `${machine.name} still holds ${cutterList(held.map((c) => c.code))}. Return ${held.length === 1 ? 'it' : 'them'} to the crib before retiring the machine.`,
        data: { cutters: held.map((c) => c.code) },
      })
    }
    await tx.updateTable('machines').set({ active: false, retired_at: new Date() })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
  })
  return requireMachine(useDb(), user.shopId, id)
})
