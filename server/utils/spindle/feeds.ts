// Gathers what feeds and speeds need for one bit, material and machine of a shop (the chip-load
// row, the cutter's wear, a single-flute bit in the crib, the shop's own cut logs) and hands it
// to the pure computation. Every lookup is scoped to the shop; another shop's id is a 404.
import { sql } from 'kysely'
import { pickBand } from '#shared/kerf/chip-loads'
import { CAUTIONS, computeFeeds, isPlastic } from '#shared/kerf/feeds'
import { FAMILY_LABELS } from '#shared/kerf/materials'
import { learnedNudge } from '#shared/kerf/learned-settings'
import type { z } from 'zod'
import type { FeedsQuery } from '#shared/schemas/feeds'
import type { Queryable } from '../../db/connect'

// "Same cutting diameter" for the single-flute suggestion: catalogue entries typed in inches
// and millimetres differ in the third decimal.
const SAME_DIAMETER_MM = 0.01

export async function feedsFor(db: Queryable, shopId: number, q: z.output<typeof FeedsQuery>) {
  const [type, material, machine, cutter] = await Promise.all([
    db.selectFrom('cutter_types')
      .select(['id', 'name', 'flutes', 'cutting_diameter_mm', 'cutting_length_mm', 'helix', 'profile', 'v_angle_deg'])
      .where('shop_id', '=', shopId).where('id', '=', q.typeId).executeTakeFirst(),
    db.selectFrom('materials').select(['id', 'name', 'family']).where('shop_id', '=', shopId).where('id', '=', q.materialId).executeTakeFirst(),
    db.selectFrom('machines').select(['id', 'name', 'min_rpm', 'max_rpm']).where('shop_id', '=', shopId).where('id', '=', q.machineId).executeTakeFirst(),
    q.cutterId === undefined
      ? undefined
      : db.selectFrom('cutters as c').innerJoin('shops as s', 's.id', 'c.shop_id')
          .select(['c.id', 'c.code', 'c.type_id', 'c.diameter_mm', 'c.life_used', 's.life_threshold'])
          .where('c.shop_id', '=', shopId).where('c.id', '=', q.cutterId).executeTakeFirst(),
  ])
  if (!type) notFound('cutter type')
  if (!material) notFound('material')
  if (!machine) notFound('machine')
  if (q.cutterId !== undefined && !cutter) notFound('cutter')
  if (cutter && cutter.type_id !== type.id) {
    fieldError({ cutterId: 'is of another cutter type' }, { message: `cutterId: cutter ${cutter.code} is of another cutter type. Choose its own type, or leave the cutter out.` })
  }

  const family = material.family
  const diameterMm = cutter?.diameter_mm ?? type.cutting_diameter_mm
  const choice = pickBand(await chipLoadRows(db, shopId, family), family, diameterMm)
  if (!choice) {
    throw createError({
      statusCode: 409,
      statusMessage: `The shop's chip-load table has no row for ${FAMILY_LABELS[family].toLowerCase()}. Ask the crib manager to check the chip loads page.`,
    })
  }

  const plastic = isPlastic(family)
  const [single, logs] = await Promise.all([
    plastic && type.flutes >= 2
      ? db.selectFrom('cutter_types as t')
          .innerJoin('cutters as c', (j) => j.onRef('c.type_id', '=', 't.id').onRef('c.shop_id', '=', 't.shop_id'))
          .select('t.name').distinct()
          .where('t.shop_id', '=', shopId).where('t.id', '!=', type.id)
          .where('t.flutes', '=', 1).where('t.helix', '=', 'upcut').where('t.profile', 'in', ['o_flute', 'square_end'])
          .where(sql<number>`abs(t.cutting_diameter_mm - ${type.cutting_diameter_mm})`, '<=', SAME_DIAMETER_MM)
          .where('c.status', '=', 'in_crib')
          .orderBy('t.name').limit(1).executeTakeFirst()
      : undefined,
    db.selectFrom('cut_logs as l')
      .innerJoin('cutters as c', (j) => j.onRef('c.id', '=', 'l.cutter_id').onRef('c.shop_id', '=', 'l.shop_id'))
      .select(['l.outcome', 'l.rpm', 'l.feed_mm_per_min'])
      .where('l.shop_id', '=', shopId).where('l.voided_at', 'is', null).where('l.material_id', '=', material.id).where('c.type_id', '=', type.id)
      .where('l.rpm', 'is not', null).where('l.feed_mm_per_min', 'is not', null)
      .execute(),
  ])

  const result = computeFeeds({
    family,
    diameterMm,
    flutes: type.flutes,
    helix: type.helix,
    profile: type.profile,
    cuttingLengthMm: type.cutting_length_mm,
    machine: { name: machine.name, minRpm: machine.min_rpm, maxRpm: machine.max_rpm },
    band: choice.band,
    depthMm: q.depthMm,
    lifeUsed: cutter?.life_used,
    lifeThreshold: cutter?.life_threshold,
    singleFluteInCrib: single ? { typeName: single.name } : null,
  })
  if (choice.outside) {
    result.notes.unshift(`A ${Number(diameterMm.toFixed(3))} mm bit is ${choice.outside === 'above' ? 'larger' : 'smaller'} than any band in the chip-load table: the ${choice.band.label} row is used.`)
  }

  return {
    ...result,
    cautions: CAUTIONS,
    learned: learnedNudge(logs.map((l) => ({ outcome: l.outcome, rpm: l.rpm, feedMmPerMin: l.feed_mm_per_min })), type.flutes),
    band: { id: choice.band.id, label: choice.band.label, source: choice.band.source, outside: choice.outside },
    type: {
      id: type.id, name: type.name, flutes: type.flutes, cuttingDiameterMm: type.cutting_diameter_mm, helix: type.helix,
      profile: type.profile, vAngleDeg: type.v_angle_deg,
    },
    material: { id: material.id, name: material.name, family },
    machine: { id: machine.id, name: machine.name, minRpm: machine.min_rpm, maxRpm: machine.max_rpm },
    cutter: cutter ? { id: cutter.id, code: cutter.code, diameterMm: cutter.diameter_mm, lifeUsed: cutter.life_used, lifeThreshold: cutter.life_threshold } : null,
    diameterMm,
  }
}
export type FeedsAnswer = Awaited<ReturnType<typeof feedsFor>>
