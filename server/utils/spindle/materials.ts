// The shop's materials as the routes answer them.
import type { Queryable } from '../../db/connect'

export async function listMaterials(db: Queryable, shopId: number, opts: { id?: number, retired?: boolean } = {}) {
  let q = db.selectFrom('materials').select(['id', 'name', 'family', 'wear_factor', 'common', 'active', 'retired_at'])
    .where('shop_id', '=', shopId)
  if (opts.id !== undefined) q = q.where('id', '=', opts.id)
  if (!opts.retired) q = q.where('active', '=', true)
  const rows = await q.orderBy('active', 'desc').orderBy('common', 'desc').orderBy('name').execute()
  return rows.map((m) => ({
    id: m.id, name: m.name, family: m.family, wearFactor: m.wear_factor, common: m.common, active: m.active, retiredAt: m.retired_at,
  }))
}
export type MaterialView = Awaited<ReturnType<typeof listMaterials>>[number]

/** One material of the shop (retired too), or 404. */
export async function requireMaterial(db: Queryable, shopId: number, id: number): Promise<MaterialView> {
  const [material] = await listMaterials(db, shopId, { id, retired: true })
  if (!material) notFound('material')
  return material
}
