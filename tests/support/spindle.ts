// Puts machines, a cutter type and cutters into a test shop, straight into the database.
import { newLabelCode } from '../../shared/kerf/label-code'
import { appDb } from './db'

export interface SpindleFixture {
  machines: { changer: number, single: number, other: number }
  typeId: number
  cutters: Array<{ id: number, code: string }>
}

export async function addSpindleFixture(shopId: number, cutterCount = 3, ratedLifeMinutes = 600): Promise<SpindleFixture> {
  const db = appDb()
  try {
    const [changer, single, other] = await db.insertInto('machines').values([
      { shop_id: shopId, name: 'Big table with changer', min_rpm: 6000, max_rpm: 24000, pockets: 8 },
      { shop_id: shopId, name: 'Small router', min_rpm: 10000, max_rpm: 30000, pockets: 0 },
      { shop_id: shopId, name: 'Second big table', min_rpm: 8000, max_rpm: 24000, pockets: 8 },
    ]).returning('id').execute()
    const type = await db.insertInto('cutter_types').values({
      shop_id: shopId, name: 'Two-flute upcut 1/4"', profile: 'square_end', helix: 'upcut', flutes: 2, cutting_diameter_mm: 6.35,
      shank_diameter_mm: 6.35, cutting_length_mm: 22, overall_length_mm: 64, rated_life_minutes: ratedLifeMinutes,
      min_usable_diameter_mm: 6, unit_cost_cents: 3000,
    }).returning('id').executeTakeFirstOrThrow()
    const cutters = await db.insertInto('cutters').values(
      Array.from({ length: cutterCount }, () => ({ shop_id: shopId, type_id: type.id, code: newLabelCode(), diameter_mm: 6.35 })),
    ).returning(['id', 'code']).execute()
    return { machines: { changer: changer!.id, single: single!.id, other: other!.id }, typeId: type.id, cutters }
  } finally {
    await db.destroy()
  }
}
