// The copy of the shop a phone keeps for working without signal: every cutter (code, type, status,
// machine, life), the cutter types, materials and machines, and who it is for. Compact on purpose:
// the phone refreshes it whenever it is online, and works out remaining minutes and due notices
// from it with the same shared functions the server uses (shared/kerf/offline-copy.ts).
import type { OfflineCopy } from '#shared/kerf/offline-copy'

export default defineEventHandler(async (event): Promise<OfflineCopy> => {
  const user = await requireUser(event)
  const db = useDb()
  const [shop, types, cutters, materials, machines] = await Promise.all([
    db.selectFrom('shops').select(['life_threshold', 'shift_minutes', 'time_zone']).where('id', '=', user.shopId).executeTakeFirstOrThrow(),
    db.selectFrom('cutter_types')
      .select(['id', 'name', 'rated_life_minutes', 'flutes', 'cutting_diameter_mm', 'shank_diameter_mm', 'helix', 'profile', 'v_angle_deg',
        'tool_material', 'max_regrinds', 'regrind_diameter_loss_mm', 'min_usable_diameter_mm'])
      .where('shop_id', '=', user.shopId).orderBy('id').execute(),
    db.selectFrom('cutters')
      .select(['id', 'code', 'type_id', 'status', 'machine_id', 'regrind_count', 'diameter_mm', 'life_used', 'life_scale',
        'minutes_total', 'minutes_this_life', 'flagged'])
      .where('shop_id', '=', user.shopId).orderBy('id').execute(),
    db.selectFrom('materials').select(['id', 'name', 'family', 'wear_factor', 'common'])
      .where('shop_id', '=', user.shopId).where('active', '=', true).orderBy('common', 'desc').orderBy('name').execute(),
    listMachines(db, user.shopId, { retired: false }),
  ])
  setResponseHeader(event, 'cache-control', 'private, no-store')
  return {
    takenAt: new Date().toISOString(),
    user: { id: user.id, shopId: user.shopId, name: user.name, role: user.role },
    shop: { lifeThreshold: shop.life_threshold, shiftMinutes: shop.shift_minutes, timeZone: shop.time_zone },
    types: types.map((t) => ({
      id: t.id, name: t.name, ratedLifeMinutes: t.rated_life_minutes, flutes: t.flutes, cuttingDiameterMm: t.cutting_diameter_mm,
      shankDiameterMm: t.shank_diameter_mm, helix: t.helix, profile: t.profile, vAngleDeg: t.v_angle_deg, toolMaterial: t.tool_material,
      maxRegrinds: t.max_regrinds, regrindDiameterLossMm: t.regrind_diameter_loss_mm, minUsableDiameterMm: t.min_usable_diameter_mm,
    })),
    // One row a cutter, in the order of OfflineCutterRow: a few hundred cutters stay a few kilobytes.
    cutters: cutters.map((c) => [c.id, c.code, c.type_id, c.status, c.machine_id, c.regrind_count, c.diameter_mm, c.life_used,
      c.life_scale, c.minutes_total, c.minutes_this_life, c.flagged]),
    materials: materials.map((m) => ({ id: m.id, name: m.name, family: m.family, wearFactor: m.wear_factor, common: m.common })),
    // As GET /api/machines has them, so the load picker works the same without a connection.
    machines,
  }
})
