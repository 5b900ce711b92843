// Add a machine.
import { MachineBody } from '#shared/schemas/machines'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const body = await readValidatedBody(event, parseWith(MachineBody))
  const db = useDb()
  await assertNameFree(db, 'machines', user.shopId, body.name)
  const { id } = await withUniqueName('machines', () => db.insertInto('machines').values({
    shop_id: user.shopId, name: body.name, description: body.description ?? '', min_rpm: body.minRpm, max_rpm: body.maxRpm,
    pockets: body.pockets, spindle_power_kw: body.spindlePowerKw ?? null, bed_x_mm: body.bedXMm ?? null, bed_y_mm: body.bedYMm ?? null,
  }).returning('id').executeTakeFirstOrThrow())
  setResponseStatus(event, 201)
  return requireMachine(db, user.shopId, id)
})
