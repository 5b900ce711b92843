// Loading a cutter into a machine. The cutter's row lock makes two operators loading the same bit
// at once end with one success and one 409 that names the machine. A machine without a tool
// changer holds one bit: loading a second answers 409 naming the bit there, unless the request
// names that bit in `returnCutterId`, which goes back to the crib in the same transaction. The
// machine's row is locked first, so two loads into one such machine at once queue and end with
// one bit in it (FOR NO KEY UPDATE, which two loads take in turn).
import type { Db } from '../../db/connect'
import type { SessionUser } from '../platform/auth'
import { badField } from '../platform/validation'
import { requireCutterView } from './cutter-view'
import { cutterList } from './machines'
import { lockCutter, recordEvent, STATUS_SENTENCE } from './spindle'

/** Loads the shop's cutter `id` into machine `machineId` and answers the cutter as the pages show it. */
export async function loadCutter(db: Db, user: SessionUser, id: number, machineId: number, returnCutterId?: number) {
  await db.transaction().execute(async (tx) => {
    const machine = await tx.selectFrom('machines').select(['id', 'name', 'pockets', 'active'])
      .where('shop_id', '=', user.shopId).where('id', '=', machineId)
      // Not FOR UPDATE: a cut log's foreign key takes KEY SHARE on the machine while it holds the
      // cutter, and FOR UPDATE against that would deadlock. Loads still queue on each other.
      .forNoKeyUpdate().executeTakeFirst()
    if (!machine) badField('machineId', 'no such machine in your shop')
    if (!machine.active) badField('machineId', `${machine.name} is retired; choose another machine or ask the crib manager to bring it back`)
    const cutter = await lockCutter(tx, user.shopId, id)
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
    const held = await tx.selectFrom('cutters').select(['id', 'code'])
      .where('shop_id', '=', user.shopId).where('machine_id', '=', machineId).where('status', '=', 'in_spindle')
      .orderBy('code').forUpdate().execute()
    const toReturn = held.filter((h) => h.id === returnCutterId)
    if (machine.pockets === 0 && held.length > toReturn.length) {
      const codes = held.map((h) => h.code)
      throw createError({
        statusCode: 409,
        statusMessage: `${machine.name} holds one bit at a time and ${cutterList(codes)} ${codes.length === 1 ? 'is' : 'are'} in it. Return ${codes.length === 1 ? 'it' : 'them'} first, or return that one and load this.`,
        data: { machineId, machineName: machine.name, held },
      })
    }
    for (const p of toReturn) {
      await tx.updateTable('cutters').set({ status: 'in_crib', machine_id: null, updated_at: new Date() })
        .where('shop_id', '=', user.shopId).where('id', '=', p.id).execute()
      await recordEvent(tx, {
        shopId: user.shopId, cutterId: p.id, kind: 'returned', from: 'in_spindle', to: 'in_crib', machineId,
        actorId: user.id, note: `Taken out when ${cutter.code} was loaded`,
      })
    }
    await tx.updateTable('cutters').set({ status: 'in_spindle', machine_id: machineId, updated_at: new Date() })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    await recordEvent(tx, { shopId: user.shopId, cutterId: id, kind: 'loaded', from: 'in_crib', to: 'in_spindle', machineId, actorId: user.id })
  })
  return requireCutterView(db, user.shopId, { id })
}
