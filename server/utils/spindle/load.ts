// Loading a cutter into a machine. The row lock makes two operators loading the same bit at once
// end with one success and one 409 that names the machine. On a machine without a tool changer
// the bit that was in the spindle goes back to the crib.
import type { Db } from '../../db/connect'
import type { SessionUser } from '../platform/auth'
import { badField } from '../platform/validation'
import { requireCutterView } from './cutter-view'
import { alreadyDone, lockCutter, recordEvent, STATUS_SENTENCE } from './spindle'

/** Loads the shop's cutter `id` into machine `machineId` and answers the cutter as the pages show it.
 *  With the phone's key, a load sent again after a lost answer is done once, whatever happened since. */
export async function loadCutter(db: Db, user: SessionUser, id: number, machineId: number, options: { idempotencyKey?: string } = {}) {
  await db.transaction().execute(async (tx) => {
    const machine = await tx.selectFrom('machines').select(['id', 'name', 'tool_changer'])
      .where('shop_id', '=', user.shopId).where('id', '=', machineId).where('active', '=', true)
      .executeTakeFirst()
    if (!machine) badField('machineId', 'no such machine in your shop')
    const cutter = await lockCutter(tx, user.shopId, id)
    if (await alreadyDone(tx, user.shopId, options.idempotencyKey)) return
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
    if (!machine.tool_changer) {
      const previous = await tx.selectFrom('cutters').select(['id', 'code'])
        .where('shop_id', '=', user.shopId).where('machine_id', '=', machineId).where('status', '=', 'in_spindle')
        .forUpdate().execute()
      for (const p of previous) {
        await tx.updateTable('cutters').set({ status: 'in_crib', machine_id: null, updated_at: new Date() })
          .where('shop_id', '=', user.shopId).where('id', '=', p.id).execute()
        await recordEvent(tx, {
          shopId: user.shopId, cutterId: p.id, kind: 'returned', from: 'in_spindle', to: 'in_crib', machineId,
          actorId: user.id, note: `Taken out when ${cutter.code} was loaded`,
        })
      }
    }
    await tx.updateTable('cutters').set({ status: 'in_spindle', machine_id: machineId, updated_at: new Date() })
      .where('shop_id', '=', user.shopId).where('id', '=', id).execute()
    await recordEvent(tx, { shopId: user.shopId, cutterId: id, kind: 'loaded', from: 'in_crib', to: 'in_spindle', machineId, actorId: user.id, idempotencyKey: options.idempotencyKey })
  })
  return requireCutterView(db, user.shopId, { id })
}
