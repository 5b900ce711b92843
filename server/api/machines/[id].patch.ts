// Change a machine. Fewer pockets than the cutters it holds now is refused with a 409 naming
// them: they are returned first. The machine's row is locked so a load cannot slip in between.
import { IdParams } from '#shared/schemas/crib'
import { MachineUpdateBody, rpmProblems } from '#shared/schemas/machines'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  const body = await readValidatedBody(event, parseWith(MachineUpdateBody))
  await transaction(async (tx) => {
    const machine = await lockMachine(tx, user.shopId, id)
    if (body.name !== undefined) await assertNameFree(tx, 'machines', user.shopId, body.name, id)
    badFields(rpmProblems(body.minRpm ?? machine.min_rpm, body.maxRpm ?? machine.max_rpm))
    if (body.pockets !== undefined && body.pockets !== machine.pockets) {
      const held = await tx.selectFrom('cutters').select('code')
        .where('shop_id', '=', user.shopId).where('machine_id', '=', id).where('status', '=', 'in_spindle').orderBy('code').execute()
      const room = body.pockets === 0 ? 1 : body.pockets
      if (held.length > room) {
        const message = `${machine.name} holds ${held.length} cutters (${cutterList(held.map((c) => c.code))}); return ${held.length - room} of them first.`
        throw createError({ statusCode: 409, statusMessage: `pockets: ${message}`, data: { fields: { pockets: message }, cutters: held.map((c) => c.code) } })
      }
    }
    const changes = {
      name: body.name, description: body.description, min_rpm: body.minRpm, max_rpm: body.maxRpm, pockets: body.pockets,
      spindle_power_kw: body.spindlePowerKw, bed_x_mm: body.bedXMm, bed_y_mm: body.bedYMm,
    }
    if (Object.values(changes).some((v) => v !== undefined)) {
      await withUniqueName('machines', () => tx.updateTable('machines').set(changes)
        .where('shop_id', '=', user.shopId).where('id', '=', id).execute())
    }
  })
  return requireMachine(useDb(), user.shopId, id)
})
