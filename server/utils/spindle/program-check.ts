// Gathers what the check before the job needs (the machine, its pockets and tool map, the
// material, the chip-load rows, sharp spares) and runs the pure check. The run route uses the
// same answer, so what the operator saw checked is what gets logged.
import { checkProgram, type PocketCutter } from '#shared/kerf/nc/check'
import { CAUTIONS } from '#shared/kerf/feeds'
import type { Queryable } from '../../db/connect'

type ProgramRow = Awaited<ReturnType<typeof requireProgram>>

/** The tool-number → pocket map of a machine of the shop. */
export async function toolMapOf(db: Queryable, shopId: number, machineId: number): Promise<Map<number, number>> {
  const rows = await db.selectFrom('machine_tool_pockets').select(['tool', 'pocket'])
    .where('shop_id', '=', shopId).where('machine_id', '=', machineId).orderBy('tool').execute()
  return new Map(rows.map((r) => [r.tool, r.pocket]))
}

/** What sits in each pocket of a machine (a manual collet's one cutter as pocket 1). */
export async function pocketCutters(db: Queryable, shopId: number, machine: { id: number, pockets: number }): Promise<Map<number, PocketCutter>> {
  const rows = await db.selectFrom('cutters as c')
    .innerJoin('cutter_types as t', (j) => j.onRef('t.id', '=', 'c.type_id').onRef('t.shop_id', '=', 'c.shop_id'))
    .select(['c.id', 'c.code', 'c.pocket', 'c.type_id', 't.name as type_name', 'c.diameter_mm', 't.flutes', 't.helix', 't.cutting_length_mm',
      't.rated_life_minutes', 'c.life_scale', 'c.life_used', 'c.flagged'])
    .where('c.shop_id', '=', shopId).where('c.machine_id', '=', machine.id).where('c.status', '=', 'in_spindle')
    .orderBy('c.pocket').orderBy('c.code').execute()
  const map = new Map<number, PocketCutter>()
  for (const r of rows) {
    const pocket = machine.pockets === 0 ? 1 : r.pocket
    if (pocket == null || map.has(pocket)) continue
    map.set(pocket, {
      id: r.id, code: r.code, typeId: r.type_id, typeName: r.type_name, diameterMm: r.diameter_mm, flutes: r.flutes, helix: r.helix,
      cuttingLengthMm: r.cutting_length_mm, ratedLifeMinutes: r.rated_life_minutes, lifeScale: r.life_scale, lifeUsed: r.life_used, flagged: r.flagged,
    })
  }
  return map
}

export async function checkBeforeJob(db: Queryable, shopId: number, programOrId: number | ProgramRow, q: { machineId: number, materialId: number, repeats: number }) {
  const program = typeof programOrId === 'number' ? await requireProgram(db, shopId, programOrId) : programOrId
  const machine = await db.selectFrom('machines')
    .select(['id', 'name', 'min_rpm', 'max_rpm', 'pockets', 'acceleration_mm_s2', 'rapid_mm_per_min', 'active'])
    .where('shop_id', '=', shopId).where('id', '=', q.machineId).executeTakeFirst()
  if (!machine) badField('machineId', 'no such machine in your shop')
  if (!machine.active) badField('machineId', `${machine.name} is retired; choose another machine`)
  const material = await db.selectFrom('materials').select(['id', 'name', 'family', 'wear_factor'])
    .where('shop_id', '=', shopId).where('id', '=', q.materialId).where('active', '=', true).executeTakeFirst()
  if (!material) badField('materialId', 'no such material in your shop')

  const [estimates, toolMap, pockets, chipLoads, shop] = await Promise.all([
    estimatesFor(db, program, shopId, machine),
    toolMapOf(db, shopId, machine.id),
    pocketCutters(db, shopId, machine),
    chipLoadRows(db, shopId, material.family),
    db.selectFrom('shops').select(['life_threshold']).where('id', '=', shopId).executeTakeFirstOrThrow(),
  ])
  const typeIds = [...new Set([...pockets.values()].map((c) => c.typeId))]
  const spareRows = typeIds.length
    ? await db.selectFrom('cutters').select(['type_id', 'code'])
      .where('shop_id', '=', shopId).where('type_id', 'in', typeIds).where('status', '=', 'in_crib')
      .where('flagged', 'is', null).where('life_used', '<', shop.life_threshold).orderBy('life_used').orderBy('code').execute()
    : []
  const spares = new Map<number, string[]>()
  for (const s of spareRows) spares.set(s.type_id, [...(spares.get(s.type_id) ?? []), s.code])

  const byTool = new Map(estimates.map((e) => [e.tool, e]))
  const tools = program.tools.map((t) => ({ ...t, estimatedMinutes: byTool.get(t.tool)?.estimatedMinutes ?? t.estimatedMinutes, rapidMinutes: byTool.get(t.tool)?.rapidMinutes ?? t.rapidMinutes }))
  const checks = checkProgram({
    tools, repeats: q.repeats,
    machine: { name: machine.name, minRpm: machine.min_rpm, maxRpm: machine.max_rpm, pockets: machine.pockets },
    toolMap, pockets, material: { name: material.name, family: material.family, wearFactor: material.wear_factor },
    chipLoads, lifeThreshold: shop.life_threshold, spares,
  })
  return {
    program: { id: program.id, name: program.name, units: program.units, problems: program.problems },
    machine: { id: machine.id, name: machine.name, pockets: machine.pockets, accelerationMmPerS2: machine.acceleration_mm_s2, rapidMmPerMin: machine.rapid_mm_per_min },
    material: { id: material.id, name: material.name, family: material.family },
    repeats: q.repeats,
    lifeThreshold: shop.life_threshold,
    tools: checks.map((c) => {
      const t = tools.find((x) => x.tool === c.tool)!
      return {
        tool: c.tool, pocket: c.pocket,
        cutter: c.cutter && {
          id: c.cutter.id, code: c.cutter.code, typeName: c.cutter.typeName, helix: c.cutter.helix, flutes: c.cutter.flutes,
          lifeUsed: c.cutter.lifeUsed, lifeLeftMinutes: Math.round(c.cutter.lifeLeftMinutes * 100) / 100,
          chipLoadMm: c.cutter.chipLoadMm === null ? null : Math.round(c.cutter.chipLoadMm * 10000) / 10000,
        },
        minutesNeeded: Math.round(c.minutesNeeded * 10000) / 10000,
        estimatedMinutes: t.estimatedMinutes,
        spindleRpm: t.spindleRpm, feedsMmPerMin: t.feedsMmPerMin, maxDepthMm: t.maxDepthMm,
        chipLoadRange: c.chipLoadRange,
        warnings: c.warnings,
      }
    }),
    cautions: CAUTIONS,
  }
}
export type CheckAnswer = Awaited<ReturnType<typeof checkBeforeJob>>
