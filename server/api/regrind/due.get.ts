// The crib's resharpening list: the cutters due, each with why and whether to resharpen or
// retire it, marked when a draft already holds it; and the suppliers a batch can go to.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'crib_manager')
  const db = useDb()
  const [due, shop, suppliers, last] = await Promise.all([
    dueCutters(db, user.shopId),
    db.selectFrom('shops').select('regrind_life_fraction').where('id', '=', user.shopId).executeTakeFirstOrThrow(),
    db.selectFrom('suppliers').select(['id', 'name', 'email']).where('shop_id', '=', user.shopId).orderBy('name').execute(),
    // The supplier of the latest batch is the likely one for the next.
    db.selectFrom('regrind_batches').select('supplier_id')
      .where('shop_id', '=', user.shopId).where('supplier_id', 'is not', null)
      .orderBy('created_at', 'desc').orderBy('id', 'desc').limit(1).executeTakeFirst(),
  ])
  return {
    lifeThreshold: due.lifeThreshold,
    regrindLifeFraction: shop.regrind_life_fraction,
    cutters: due.cutters,
    suppliers,
    lastSupplierId: last?.supplier_id ?? null,
  }
})
