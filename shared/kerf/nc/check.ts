// The check before the job: for each tool a program calls, the cutter in the pocket it maps to,
// its life left in the material against the minutes the job needs, and warnings (life, fit,
// programmed chip load, spindle range, depth). Pure: the route gathers the rows.
import { pickBand, type ChipLoadBand } from '../chip-loads'
import { chipLoadOf, isPlastic, type Helix } from '../feeds'
import { remainingMinutes } from '../life'
import type { MaterialFamily } from '../materials'

export type CheckWarningCode =
  | 'empty_pocket' | 'not_enough_life' | 'due' | 'flagged_dull' | 'downcut_in_plastic'
  | 'chip_load_low' | 'chip_load_high' | 'no_spindle_speed' | 'spindle_out_of_range' | 'too_deep'
export interface CheckWarning { code: CheckWarningCode, message: string }

export interface PocketCutter {
  id: number
  code: string
  typeId: number
  typeName: string
  diameterMm: number
  flutes: number
  helix: Helix
  cuttingLengthMm: number
  ratedLifeMinutes: number
  lifeScale: number
  lifeUsed: number
  flagged: 'dull' | 'broken' | null
}

export interface CheckInput {
  tools: Array<{ tool: number, estimatedMinutes: number, maxDepthMm: number, spindleRpm: number[], feedsMmPerMin: number[] }>
  repeats: number
  machine: { name: string, minRpm: number, maxRpm: number, pockets: number }
  /** The shop's tool-number → pocket map for this machine; unmapped tools use their own number. */
  toolMap: ReadonlyMap<number, number>
  /** What sits in each pocket (a manual collet's one cutter is pocket 1 to every tool number). */
  pockets: ReadonlyMap<number, PocketCutter>
  material: { name: string, family: MaterialFamily, wearFactor: number }
  chipLoads: readonly ChipLoadBand[]
  lifeThreshold: number
  /** Sharp cutters of each type in the crib, by type id. */
  spares: ReadonlyMap<number, string[]>
}

export interface ToolCheck {
  tool: number
  pocket: number
  cutter: (PocketCutter & { lifeLeftMinutes: number, chipLoadMm: number | null }) | null
  minutesNeeded: number
  chipLoadRange: { minMm: number, maxMm: number } | null
  warnings: CheckWarning[]
}

const r1 = (v: number) => Math.round(v * 10) / 10
const mm3 = (v: number) => Math.round(v * 1000) / 1000

export function checkProgram(input: CheckInput): ToolCheck[] {
  const { machine, material } = input
  return input.tools.map((t) => {
    const pocket = machine.pockets === 0 ? 1 : (input.toolMap.get(t.tool) ?? t.tool)
    const cutter = input.pockets.get(pocket) ?? null
    const minutesNeeded = t.estimatedMinutes * input.repeats
    const warnings: CheckWarning[] = []
    const where = machine.pockets === 0 ? machine.name : `Pocket ${pocket} of ${machine.name}`

    // Spindle speeds are the program's and the machine's, whatever the cutter.
    const outside = t.spindleRpm.filter((rpm) => rpm < machine.minRpm || rpm > machine.maxRpm)
    if (outside.length) {
      warnings.push({ code: 'spindle_out_of_range', message: `T${t.tool} runs the spindle at ${outside.join(', ')} rpm; ${machine.name} runs ${machine.minRpm} to ${machine.maxRpm} rpm.` })
    }
    if (!t.spindleRpm.length) {
      warnings.push({ code: 'no_spindle_speed', message: `T${t.tool} cuts with no spindle speed set (S with M3 or M4) in the program, so its chip load cannot be worked out.` })
    }

    if (!cutter) {
      warnings.unshift({ code: 'empty_pocket', message: `${where} is empty: load a cutter for T${t.tool} before the job.` })
      return { tool: t.tool, pocket, cutter: null, minutesNeeded, chipLoadRange: null, warnings }
    }

    const lifeLeftMinutes = remainingMinutes(cutter.lifeUsed, cutter.ratedLifeMinutes, material.wearFactor, cutter.lifeScale)
    if (lifeLeftMinutes < minutesNeeded) {
      const spares = input.spares.get(cutter.typeId) ?? []
      warnings.push({
        code: 'not_enough_life',
        message: `${cutter.code} has about ${r1(lifeLeftMinutes)} min of life left in ${material.name}; this job needs ${r1(minutesNeeded)} min. `
          + (spares.length ? `Sharp ${cutter.typeName} in the crib: ${spares.slice(0, 5).join(', ')}${spares.length > 5 ? ` and ${spares.length - 5} more` : ''}.` : `The crib holds no sharp ${cutter.typeName}.`),
      })
    }
    if (cutter.flagged === 'dull') {
      warnings.push({ code: 'flagged_dull', message: `${cutter.code} is flagged dull: swap it before the job.` })
    } else if (cutter.lifeUsed >= input.lifeThreshold) {
      warnings.push({ code: 'due', message: `${cutter.code} is due for resharpening (${Math.round(cutter.lifeUsed * 100)} % of its life used): a dull bit melts plastic and leaves fuzz.` })
    }
    if (isPlastic(material.family) && (cutter.helix === 'downcut' || cutter.helix === 'compression')) {
      warnings.push({ code: 'downcut_in_plastic', message: `${cutter.code} is a ${cutter.helix} bit: in ${material.name} it packs chips into the cut, where they melt and weld. Use an upcut, best a single-flute O-flute.` })
    }
    if (t.maxDepthMm > cutter.cuttingLengthMm) {
      warnings.push({ code: 'too_deep', message: `T${t.tool} cuts ${mm3(t.maxDepthMm)} mm deep; ${cutter.code} has ${cutter.cuttingLengthMm} mm of cutting length.` })
    }

    // The programmed chip load at the cutting feed: the highest feed the tool runs (lower feeds are
    // plunges and ramps) at its highest spindle speed, over the cutter's flutes.
    const choice = pickBand(input.chipLoads, material.family, cutter.diameterMm)
    const chipLoadRange = choice ? { minMm: choice.band.chipLoadMinMm, maxMm: choice.band.chipLoadMaxMm } : null
    let chipLoadMm: number | null = null
    if (t.spindleRpm.length && t.feedsMmPerMin.length) {
      chipLoadMm = chipLoadOf(Math.max(...t.feedsMmPerMin), Math.max(...t.spindleRpm), cutter.flutes)
      if (chipLoadRange && chipLoadMm < chipLoadRange.minMm) {
        warnings.push({ code: 'chip_load_low', message: `T${t.tool} asks ${cutter.code} for ${mm3(chipLoadMm)} mm a tooth, below the shop's ${mm3(chipLoadRange.minMm)} to ${mm3(chipLoadRange.maxMm)} mm for ${material.name}: the edge rubs and heats, the usual cause of melted plastic and re-welded chips. Raise the feed or lower the speed.` })
      } else if (chipLoadRange && chipLoadMm > chipLoadRange.maxMm) {
        warnings.push({ code: 'chip_load_high', message: `T${t.tool} asks ${cutter.code} for ${mm3(chipLoadMm)} mm a tooth, above the shop's ${mm3(chipLoadRange.minMm)} to ${mm3(chipLoadRange.maxMm)} mm for ${material.name}: the bit may break or chip the edge. Lower the feed or raise the speed.` })
      }
    }
    return { tool: t.tool, pocket, cutter: { ...cutter, lifeLeftMinutes, chipLoadMm }, minutesNeeded, chipLoadRange, warnings }
  })
}
