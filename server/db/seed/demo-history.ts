// A year in the demo shop's crib, simulated in memory: each cutter's lives, the jobs it cut,
// its trips to the regrinder and how its year ended. Pure and deterministic (seeded PRNG), so
// demo.ts only has to write what comes out. Times are ms since epoch; day 365 is yesterday.
import { lifeAdded, roundLife } from '../../../shared/kerf/life'
import { LABEL_ALPHABET, LABEL_LENGTH } from '../../../shared/kerf/label-code'
import type { CutOutcome, CutterEventKind, CutterStatus, MaterialFamily } from '../schema'
import {
  CRIB_EMAIL, CUTTER_TYPES, DEMO_SHOP, MACHINES, MATERIALS, PEOPLE, STORIES,
  type DemoCutterType, type DemoMaterial, type Ending, type Story,
} from './demo-data'

export const DAY = 86_400_000
const HOUR = 3_600_000
const MINUTE = 60_000
/** Days the two received purchase orders arrived: opening stock, then replacements. */
export const ORDER_DAYS = { A: 0, B: 300 } as const
/** Resharpening runs: sent on these days, back TURNAROUND days later. The last one is still out. */
export const BATCH_SENDS = [30, 75, 120, 165, 210, 255, 300]
export const TURNAROUND = 10
export const OPEN_BATCH_SEND = 358
/** The restocking order still open with the supplier was sent this day. */
export const OPEN_ORDER_DAY = 362
const LAST_DAY = 365

/** mulberry32: tiny, fast and good enough to make the same demo shop on every run. */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

export class Random {
  constructor(readonly next: () => number) {}
  float(lo: number, hi: number) { return lo + (hi - lo) * this.next() }
  int(lo: number, hi: number) { return lo + Math.floor(this.next() * (hi - lo + 1)) }
  chance(p: number) { return this.next() < p }
  pick<T>(items: readonly T[]): T { return items[Math.floor(this.next() * items.length)]! }
  weighted(weights: Record<string, number>): string {
    const entries = Object.entries(weights)
    let r = this.next() * entries.reduce((s, [, w]) => s + w, 0)
    for (const [key, w] of entries) if ((r -= w) < 0) return key
    return entries[entries.length - 1]![0]
  }
  shuffle<T>(items: T[]): T[] {
    for (let i = items.length - 1; i > 0; i--) {
      const j = Math.floor(this.next() * (i + 1));
      [items[i], items[j]] = [items[j]!, items[i]!]
    }
    return items
  }
  labelCode(): string {
    let code = ''
    while (code.length < LABEL_LENGTH) code += LABEL_ALPHABET[Math.floor(this.next() * LABEL_ALPHABET.length)]
    return code
  }
}

export interface SimCutter {
  code: string, type: DemoCutterType, origin: 'A' | 'B', status: CutterStatus, machine: string | null
  diameter: number, regrindCount: number, lifeScale: number, lifeUsed: number, minutesThisLife: number, minutesTotal: number
  flagged: 'dull' | 'broken' | null, flaggedAt: number | null, retiredReason: 'worn' | 'broken' | 'undersize' | null
  receivedAt: number, updatedAt: number
}
export interface SimCut {
  cutter: number, machine: string, operator: string, material: DemoMaterial, minutes: number, lifeAdded: number
  regrindCount: number, rpm: number | null, feed: number | null, outcome: CutOutcome, note: string, at: number
}
export interface SimEvent {
  cutter: number, kind: CutterEventKind, from: CutterStatus | null, to: CutterStatus | null
  machine: string | null, actor: string, note: string, at: number
}
/** batch: index into BATCH_SENDS, or -1 for the batch still at the regrinder. */
export interface SimItem { batch: number, cutter: number, before: number, after: number | null, result: 'reground' | 'retired' | null, cost: number }
export interface History { cutters: SimCutter[], cuts: SimCut[], events: SimEvent[], items: SimItem[] }

const OPERATORS = PEOPLE.filter((p) => p.role === 'operator').map((p) => p.email)
const MATERIAL = Object.fromEntries(MATERIALS.map((m) => [m.key, m])) as Record<string, DemoMaterial>
const BAD: Record<MaterialFamily, CutOutcome[]> = {
  hard_plastic: ['melted', 'chip_out'], soft_plastic: ['melted', 'fuzzy'], foam: ['fuzzy'], wood: ['fuzzy', 'chip_out'],
  sheet_goods: ['chip_out', 'fuzzy'], composite: ['chip_out', 'melted'], non_ferrous: ['melted'],
}
const NOTES: Record<CutOutcome, string> = {
  clean: '', melted: 'Chips welded back onto the edge', fuzzy: 'Fuzzy edge, deburred by hand',
  chip_out: 'Chip-out along the top face', broken: 'Snapped in the cut',
}
// Chip load per tooth at 1/4" (mm), by family: a plausible starting point, not advice.
const CHIP_LOAD: Record<MaterialFamily, number> = {
  hard_plastic: 0.15, soft_plastic: 0.18, foam: 0.25, wood: 0.12, sheet_goods: 0.13, composite: 0.1, non_ferrous: 0.05,
}
const round = (v: number, places: number) => Math.round(v * 10 ** places) / 10 ** places

interface PlannedCut { material: DemoMaterial, minutes: number, lifeAdded: number, outcome: CutOutcome }

type CastStory = Story & { origin: 'A' | 'B' }
interface LifePlan { from: number, to: number, target: number, flagDull: boolean, final: boolean }

/** Simulates the whole year. `dayZero` is midnight UTC a year before yesterday. */
export function simulateYear(seed: number, dayZero: number): History {
  const year = new CribYear(new Random(mulberry32(seed)), dayZero)
  for (const story of castStories(year.rng)) year.cutter(story)
  return year.history
}

class CribYear {
  readonly history: History = { cutters: [], cuts: [], events: [], items: [] }
  private readonly codes = new Set<string>()
  constructor(readonly rng: Random, private readonly dayZero: number) {}

  private at(day: number, hour: number) { return this.dayZero + day * DAY + hour * HOUR }

  private event(cutter: number, kind: CutterEventKind, from: CutterStatus | null, to: CutterStatus | null, at: number,
    actor = CRIB_EMAIL, machine: string | null = null, note = '') {
    this.history.events.push({ cutter, kind, from, to, machine, actor, note, at })
    const c = this.history.cutters[cutter]!
    c.updatedAt = Math.max(c.updatedAt, at)
  }

  /** One cutter's year: received, then each sharp life followed by a trip to the regrinder, then its ending. */
  cutter(story: CastStory) {
    const { rng } = this
    const t = CUTTER_TYPES.find((ct) => ct.key === story.type)!
    const index = this.history.cutters.length
    let code = rng.labelCode()
    while (this.codes.has(code)) code = rng.labelCode()
    this.codes.add(code)
    const c: SimCutter = {
      code, type: t, origin: story.origin, status: 'in_crib', machine: null, diameter: t.diameter, regrindCount: 0,
      lifeScale: 1, lifeUsed: 0, minutesThisLife: 0, minutesTotal: 0, flagged: null, flaggedAt: null, retiredReason: null,
      receivedAt: this.at(ORDER_DAYS[story.origin], 11), updatedAt: 0,
    }
    this.history.cutters.push(c)
    this.event(index, 'received', null, 'in_crib', c.receivedAt)

    // Which resharpening runs it rode (an undersize cutter's last run retired it), and when its last life ends.
    const ending = story.ending
    const startDay = ORDER_DAYS[story.origin] + 1
    const wanted = Math.min(story.regrinds ?? 0, t.maxRegrinds) + (ending === 'undersize' ? 1 : 0)
    const endsEarly = ['worn', 'broken', 'lost'].includes(ending)
    const horizon = ending === 'at_regrind' ? OPEN_BATCH_SEND : endsEarly ? 300 : LAST_DAY
    const fits = BATCH_SENDS.map((_, i) => i)
      .filter((i) => BATCH_SENDS[i]! >= startDay + 20 && BATCH_SENDS[i]! + TURNAROUND <= horizon - 15)
    const batches = rng.shuffle(fits).slice(0, wanted).sort((a, b) => a - b)
    if (batches.length < wanted) throw new Error(`demo seed: no room for ${wanted} regrinds of a ${t.key}`)
    const lives = ending === 'undersize' ? batches.length - 1 : batches.length
    const back = (life: number) => BATCH_SENDS[batches[life]!]! + TURNAROUND + 1
    const endDay = ending === 'at_regrind' ? OPEN_BATCH_SEND
      : ending === 'undersize' ? BATCH_SENDS[batches[lives]!]!
        : endsEarly ? rng.int(Math.max((lives ? back(lives - 1) : startDay) + 40, 150), 350)
          : LAST_DAY + 1

    for (let life = 0; life <= lives; life++) {
      const final = life === lives
      const flagDull = final ? ending === 'dull' || (['at_regrind', 'worn', 'undersize'].includes(ending) && rng.chance(0.4)) : rng.chance(0.3)
      this.cutLife(index, story, {
        from: life === 0 ? startDay : back(life - 1),
        to: final ? endDay : BATCH_SENDS[batches[life]!]!,
        target: final ? finalTarget(rng, ending, c) : flagDull ? rng.float(0.72, 0.9) : rng.float(0.9, 1.06),
        flagDull,
        final,
      })
      if (!final) this.regrind(index, batches[life]!)
    }
    c.minutesTotal = round(c.minutesTotal, 2)
    this.finish(index, ending, batches[lives] ?? -1, endDay)
  }

  /** The jobs of one sharp life, in sessions: loaded, a few cuts, returned (or still loaded at the end). */
  private cutLife(index: number, story: CastStory, life: LifePlan) {
    const { rng } = this
    const c = this.history.cutters[index]!
    const t = c.type
    const planned = planCuts(rng, t, c.lifeScale, life.target, life.final && story.ending === 'broken')
    // Jobs sit on separate days when there is room, otherwise at least eight hours apart.
    const width = (life.to - life.from) / Math.max(1, planned.length)
    if (planned.length && width < 1 / 3) throw new Error(`demo seed: ${planned.length} cuts do not fit in days ${life.from}–${life.to}`)
    for (let k = 0; k < planned.length;) {
      const size = Math.min(rng.int(1, 4), planned.length - k)
      const stays = life.final && story.ending === 'in_spindle' && k + size === planned.length
      const m = stays ? MACHINES.find((x) => x.key === story.machine)! : rng.pick(MACHINES.filter((x) => t.shank <= x.maxShankMm + 1e-9))
      const operator = rng.chance(0.6) ? m.mainOperator : rng.pick(OPERATORS)
      let lastCutAt = 0
      for (let j = k; j < k + size; j++) {
        const p = planned[j]!
        const at = width >= 1
          ? this.at(life.from + Math.floor((j + 0.5) * width), rng.float(10, 17))
          : this.at(life.from + (j + 0.6 + 0.35 * rng.next()) * width, 0)
        if (j === k) this.event(index, 'loaded', 'in_crib', 'in_spindle', at - (p.minutes + 15) * MINUTE, operator, m.key)
        const rpm = rng.chance(0.75) ? spindleSpeed(rng, p.material.family, t.diameter, m.minRpm, m.maxRpm) : null
        const chip = CHIP_LOAD[p.material.family] * (t.profile === 'v_bit' || t.profile === 'ball_nose' ? 0.6 : Math.min(1.6, t.diameter / 6.35))
        this.history.cuts.push({
          cutter: index, machine: m.key, operator, material: p.material, minutes: p.minutes, lifeAdded: p.lifeAdded,
          regrindCount: c.regrindCount, rpm, feed: rpm ? Math.round((rpm * t.flutes * chip * rng.float(0.9, 1.1)) / 10) * 10 : null,
          outcome: p.outcome, note: NOTES[p.outcome], at,
        })
        c.minutesTotal += p.minutes
        c.minutesThisLife += p.minutes
        c.lifeUsed += p.lifeAdded
        c.updatedAt = Math.max(c.updatedAt, at)
        lastCutAt = at
      }
      k += size
      if (k === planned.length && life.flagDull) {
        Object.assign(c, { flagged: 'dull', flaggedAt: lastCutAt + 5 * MINUTE })
        this.event(index, 'flagged_dull', null, null, c.flaggedAt!, operator, m.key, 'Edge feels rounded, finish getting worse')
      }
      if (k === planned.length && life.final && story.ending === 'broken') {
        Object.assign(c, { flagged: 'broken', flaggedAt: lastCutAt + 2 * MINUTE })
        this.event(index, 'flagged_broken', null, null, c.flaggedAt!, operator, m.key, 'Snapped mid-cut; pieces found on the table')
      }
      if (stays) Object.assign(c, { status: 'in_spindle', machine: m.key })
      else this.event(index, 'returned', 'in_spindle', 'in_crib', lastCutAt + 10 * MINUTE, operator, m.key)
    }
    // The sum of the rounded per-cut figures, rounded as stored: what the cut logs add up to.
    c.lifeUsed = roundLife(c.lifeUsed)
    c.minutesThisLife = round(c.minutesThisLife, 2)
  }

  /** Off to the regrinder with run `b`, back sharp with a smaller diameter and a shorter life. */
  private regrind(index: number, b: number) {
    const c = this.history.cutters[index]!
    this.event(index, 'sent_to_regrind', 'in_crib', 'at_regrind', this.at(BATCH_SENDS[b]!, 10))
    const after = round(c.diameter - c.type.regrindLoss, 3)
    this.history.items.push({ batch: b, cutter: index, before: c.diameter, after, result: 'reground', cost: c.type.regrindCost })
    this.event(index, 'reground', 'at_regrind', 'in_crib', this.at(BATCH_SENDS[b]! + TURNAROUND, 11), CRIB_EMAIL, null, `Reground to ${after.toFixed(2)} mm`)
    Object.assign(c, {
      diameter: after, regrindCount: c.regrindCount + 1, lifeScale: DEMO_SHOP.regrindLifeFraction,
      lifeUsed: 0, minutesThisLife: 0, flagged: null, flaggedAt: null,
    })
  }

  /** How the year ends for a cutter, after its last cut. */
  private finish(index: number, ending: Ending, batch: number, endDay: number) {
    const c = this.history.cutters[index]!
    if (ending === 'at_regrind' || ending === 'undersize') {
      const open = ending === 'at_regrind'
      this.event(index, 'sent_to_regrind', 'in_crib', 'at_regrind', this.at(open ? OPEN_BATCH_SEND : BATCH_SENDS[batch]!, 10))
      this.history.items.push({ batch: open ? -1 : batch, cutter: index, before: c.diameter, after: null, result: open ? null : 'retired', cost: 0 })
      c.status = 'at_regrind'
    }
    if (ending === 'undersize') {
      this.event(index, 'retired', 'at_regrind', 'retired', this.at(BATCH_SENDS[batch]! + TURNAROUND, 11), CRIB_EMAIL, null,
        'Chipped corner: grinding past it would leave the bit under its minimum usable diameter')
      Object.assign(c, { status: 'retired', retiredReason: 'undersize' })
    } else if (ending === 'worn' || ending === 'broken') {
      const note = ending === 'broken' ? 'Broken in the cut'
        : c.type.maxRegrinds ? `Worn out after ${c.regrindCount} regrinds, the most this type takes` : 'Worn out: too small to be worth resharpening'
      this.event(index, 'retired', 'in_crib', 'retired', this.at(endDay + (ending === 'broken' ? 0 : this.rng.int(1, 3)), 9), CRIB_EMAIL, null, note)
      Object.assign(c, { status: 'retired', retiredReason: ending })
    } else if (ending === 'lost') {
      this.event(index, 'lost', 'in_crib', 'lost', this.at(endDay + this.rng.int(2, 9), 16), CRIB_EMAIL, null, 'Not in its slot at the stock count')
      c.status = 'lost'
    }
  }
}

/** The stories of all cutters: the listed ones plus ordinary in-crib spares, grouped by type, opening stock first. */
function castStories(rng: Random): CastStory[] {
  const all: CastStory[] = []
  for (const t of CUTTER_TYPES) {
    const listed = STORIES.filter((s) => s.type === t.key)
    if (listed.length > t.count) throw new Error(`demo seed: more stories than ${t.key} cutters`)
    const misfit = listed.find((s) => s.machine && t.shank > MACHINES.find((m) => m.key === s.machine)!.maxShankMm)
    if (misfit) throw new Error(`demo seed: a ${t.key} does not fit the ${misfit.machine} spindle`)
    all.push(...listed.map((s) => ({ ...s, origin: s.ending === 'new' ? 'B' as const : 'A' as const })))
    for (let i = listed.length; i < t.count; i++) {
      const regrinds = t.maxRegrinds && rng.chance(0.5) ? rng.int(1, Math.min(2, t.maxRegrinds)) : 0
      all.push({ type: t.key, ending: 'in_crib', regrinds, origin: !regrinds && rng.chance(0.15) ? 'B' : 'A' })
    }
  }
  return all.sort((a, b) => a.origin.localeCompare(b.origin))
}

/** Life used at the end of the year, by how the year ends. */
function finalTarget(rng: Random, ending: Ending, c: SimCutter): number {
  switch (ending) {
    case 'new': return 0
    case 'in_crib': return c.origin === 'B' ? rng.float(0, 0.6) : c.regrindCount && rng.chance(0.3) ? 0 : rng.float(0.05, 0.8)
    case 'due': return rng.float(0.9, 1)
    case 'dull': return rng.float(0.65, 0.88)
    case 'in_spindle': return rng.float(0.1, 0.8)
    case 'at_regrind': case 'undersize': return rng.float(0.9, 1.04)
    case 'worn': return rng.float(0.98, 1.12)
    case 'broken': return rng.float(0.15, 0.75)
    case 'lost': return rng.float(0.1, 0.7)
  }
}

/** Jobs until the life reaches `target`; the last job is shortened so it lands near it. */
function planCuts(rng: Random, t: DemoCutterType, scale: number, target: number, breaks: boolean): PlannedCut[] {
  const cuts: PlannedCut[] = []
  let used = 0
  while (used < target) {
    const material = MATERIAL[rng.weighted(t.materials)]!
    let minutes = 5 + Math.round(rng.next() ** 3.2 * 350) / 2
    const toTarget = ((target - used) * t.ratedLife * scale) / material.wearFactor
    if (minutes > toTarget + 5) minutes = Math.max(5, Math.ceil(toTarget * 2) / 2)
    const p = 0.03 + (used > 0.85 ? 0.2 : used > 0.6 ? 0.05 : 0)
    const outcome = rng.chance(p) ? rng.pick(BAD[material.family]) : 'clean'
    const added = roundLife(lifeAdded(minutes, material.wearFactor, t.ratedLife, scale))
    cuts.push({ material, minutes, lifeAdded: added, outcome })
    used += added
  }
  if (breaks) {
    const material = MATERIAL[rng.weighted(t.materials)]!
    const minutes = rng.int(10, 50) / 2
    cuts.push({ material, minutes, lifeAdded: roundLife(lifeAdded(minutes, material.wearFactor, t.ratedLife, scale)), outcome: 'broken' })
  }
  return cuts
}

function spindleSpeed(rng: Random, family: MaterialFamily, diameter: number, min: number, max: number): number {
  const base = family === 'foam' || family === 'soft_plastic' ? 16000 : diameter > 10 ? 16000 : 18000
  return Math.min(max, Math.max(min, Math.round((base + rng.float(-1500, 1500)) / 500) * 500))
}

/**
 * The cleanup minutes per part an operator logged with a cut, or null when none were given. Drawn
 * from a generator of its own per cut (seeded by the cut's place in time order), so adding them
 * leaves the rest of the simulated year as it was. The story: poor edges cost minutes; a two-flute
 * upcut in soft plastic leaves fuzz that costs a little even on cuts logged clean.
 */
export function cleanupMinutes(cut: SimCut, t: DemoCutterType, n: number): number | null {
  const rng = new Random(mulberry32(0xC1EA + n * 7919))
  if (cut.outcome === 'broken') return null
  if (cut.outcome !== 'clean') {
    if (!rng.chance(0.7)) return null
    const [lo, hi] = cut.outcome === 'melted' ? [6, 15] : cut.outcome === 'fuzzy' ? [4, 12] : [3, 9]
    return Math.round(rng.float(lo, hi) * 2) / 2
  }
  const fuzzyGeometry = t.flutes >= 2 && t.helix === 'upcut' && t.profile === 'square_end'
  if (fuzzyGeometry && (cut.material.family === 'soft_plastic' || cut.material.family === 'foam') && rng.chance(0.8)) {
    return Math.round(rng.float(6, 12) * 2) / 2
  }
  return null
}
