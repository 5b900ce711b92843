// What sits in each pocket of a machine (one row a pocket; a manual collet is one), with each
// cutter's life used against the shop's resharpen mark, and the machine's tool-number map.
import { IdParams } from '#shared/schemas/crib'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, parseWith(IdParams))
  const db = useDb()
  const machine = await requireMachine(db, user.shopId, id)
  const [cutters, map, shop] = await Promise.all([
    pocketCutters(db, user.shopId, machine),
    toolMapOf(db, user.shopId, id),
    db.selectFrom('shops').select('life_threshold').where('id', '=', user.shopId).executeTakeFirstOrThrow(),
  ])
  const count = Math.max(1, machine.pockets)
  return {
    machine: { id: machine.id, name: machine.name, pockets: machine.pockets, active: machine.active },
    lifeThreshold: shop.life_threshold,
    pockets: Array.from({ length: count }, (_, i) => {
      const c = cutters.get(i + 1)
      return { pocket: i + 1, cutter: c ? { id: c.id, code: c.code, typeName: c.typeName, lifeUsed: c.lifeUsed, flagged: c.flagged } : null }
    }),
    toolMap: [...map].map(([tool, pocket]) => ({ tool, pocket })),
  }
})
