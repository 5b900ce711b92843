// Loading a cutter into a machine. The cutter's row lock makes two operators loading the same bit
// at once end with one success and one 409 that names the machine. A machine without a tool
// changer holds one bit: loading a second answers 409 naming the bit there, unless the request
// names that bit in `returnCutterId`, which goes back to the crib in the same transaction. The
// machine's row is locked first, so two loads into one such machine at once queue and end with one
// bit in it. A machine with a tool changer holds one cutter a pocket: the load names the pocket
// (the phone's pocket picker), or takes the lowest free one; a taken pocket answers 409 naming
// its cutter.
import type { Db } from '../../db/connect'
import type { SessionUser } from '../platform/auth'
import { badField } from '../platform/validation'
import { requireCutterView } from './cutter-view'
import { alreadyDone, lockCutter, recordEvent, STATUS_SENTENCE } from './spindle'
import { cutterList } from './machines'

/** The load route's body; `idempotencyKey` is the phone's key when the load waited in its queue. */
export interface LoadRequest { machineId: number, returnCutterId?: number, pocket?: number, idempotencyKey?: string }

/** Loads the shop's cutter `id` into a machine and answers the cutter as the pages show it. With the
 *  phone's key, a load sent again after a lost answer is done once, whatever happened since. */
export async function loadCutter(db: Db, user: SessionUser, id: number, { machineId, returnCutterId, pocket, idempotencyKey }: LoadRequest) {
  await db.transaction().execute(async (tx) => {
    const machine = await tx.selectFrom('machines').select(['id', 'name', 'pockets', 'active'])
      .where('shop_id', '=', user.shopId).where('id', '=', machineId)
      // Not FOR UPDATE: a cut log's foreign key takes KEY SHARE on the machine while it holds the
      // cutter, and FOR UPDATE against that would deadlock. Loads still queue on each other.
      .forNoKeyUpdate().executeTakeFirst()
    if (!machine) badField('machineId', 'no such machine in your shop')
    if (!machine.active) badField('machineId', `${machine.name} is retired; choose another machine or ask the crib manager to bring it back`)
    const cutter = await lockCutter(tx, user.shopId, id)
    if (await alreadyDone(tx, user.shopId, idempotencyKey)) return
    if (cutter.status === 'in_spindle') {
      if (cutter.machine_id === machineId) return // already there: loading twice is harmless
      const where = await tx.selectFrom('machines').select('name').where('id', '=', cutter.machine_id!).executeTakeFirst()
      throw createError({
        statusCode: 409,
        statusMessage: `Cutter ${cutter.code} is already loaded in ${where?.name ?? 'another machine'}. Return it to the crib first.`,
        data: { machineId: cutter.machine_id, machineName: where?.name },
      })
    }
    if (cutter.status !== 'in_crib') {
      throw createError({ statusCode: 409, statusMessage: `Cutter ${cutter.code} ${STATUS_SENTENCE[cutter.status]} and cannot be loaded.` })
    }
    const held = await tx.selectFrom('cutters').select(['id', 'code', 'pocket'])
      .where('shop_id', '=', user.shopId).where('machine_id', '=', machineId).where('status', '=', 'in_spindle')
      .orderBy('code').forUpdate().execute()
    const toReturn = held.filter((h) => h.id === returnCutterId)
    if (machine.pockets === 0 && held.length > toReturn.length) {
      const codes = held.map((h) => h.code)
      throw createError({
        statusCode: 409,
        statusMessage: `${machine.name} holds one bit at a time and ${cutterList(codes)} ${codes.length === 1 ? 'is' : 'are'} in it. Return ${codes.length === 1 ? 'it' : 'them'} first, or return that one and load this.`,
        data: { machineId, machineName: machine.name, held: held.map((h) => ({ id: h.id, code: h.code })) },
      })
    }
    const into = machine.pockets > 0 ? choosePocket(machine, held, pocket) : null
    for (const p of toReturn) {
      await tx.updateTable('cutters').set({ status: 'in_crib', machine_id: null, pocket: null, updated_at: new Date() })
        .where('shop_id', '=', user.shopId).where('id', '=', p.id).execute()
      await recordEvent(tx, {
        shopId: user.shopId, cutterId: p.id, kind: 'returned', from: 'in_spindle', to: 'in_crib', machineId,
        actorId: user.id, note: `Taken out when ${cutter.code} was loaded`,
      })
    }
    await tx.updateTable('cutters').set({ status: 'in_spindle', machine_id: machineId, pocket: into, updated_at: new Date() })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    await recordEvent(tx, { shopId: user.shopId, cutterId: id, kind: 'loaded', from: 'in_crib', to: 'in_spindle', machineId, actorId: user.id, note: into ? `Pocket ${into}` : undefined, idempotencyKey })
  })
  return requireCutterView(db, user.shopId, { id })
}

/** The pocket a load goes into: the one asked for when it is free, else the lowest free one. */
function choosePocket(machine: { name: string, pockets: number }, held: Array<{ code: string, pocket: number | null }>, asked: number | undefined): number {
  const taken = new Map(held.filter((h) => h.pocket != null).map((h) => [h.pocket!, h.code]))
  if (asked !== undefined) {
    if (asked > machine.pockets) badField('pocket', `${machine.name} has pockets 1 to ${machine.pockets}`)
    const there = taken.get(asked)
    if (there) {
      throw createError({ statusCode: 409, statusMessage: `Pocket ${asked} of ${machine.name} holds ${there}. Return it first, or choose a free pocket.`, data: { pocket: asked, held: there } })
    }
    return asked
  }
  for (let p = 1; p <= machine.pockets; p++) if (!taken.has(p)) return p
  throw createError({ statusCode: 409, statusMessage: `All ${machine.pockets} pockets of ${machine.name} hold cutters. Return one first.` })
}
