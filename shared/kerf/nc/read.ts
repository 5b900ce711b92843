// Reads an NC program (RS274/NGC G-code as router CAM posts write it) into per-tool totals:
// feed and plunge distance, minutes at the programmed feed and with the machine's acceleration,
// rapid minutes, the deepest cut, the spindle speeds and feeds used. Semantics follow the NIST
// RS274/NGC Interpreter, Version 3 (NISTIR 6556), as LinuxCNC's interpreter carries them.
//
// Tokenising is gcode-parser's (the tokeniser of gcode-interpreter and gcode-toolpath). Their modal
// state is not used: gcode-interpreter splits a block at every G, M or T word and hands the words
// that follow to that code, so `G0 G90 X1 Y2` moves nowhere (X and Y go to G90) and `S18000 M3`
// loses the speed; it has no drilling cycles (a line of X Y after G81 becomes a rapid), and
// gcode-toolpath knows no G98/G99 nor the execution order within a block. So the modal state,
// the order of execution and the geometry are ours, below. Pure: no framework imports.
import { parseLine } from 'gcode-parser'
import { arcPassesAngle, helixLength, sweepAngle, trapezoidMinutes } from './motion'

export const DEFAULT_ACCELERATION_MM_S2 = 1000
/** Rapid rate when the machine has none of its own (ours: a moderate figure for a router). */
export const DEFAULT_RAPID_MM_PER_MIN = 10_000
/** A G83 peck rapids back down to this far above the depth it reached (0.010 in, as the
 *  RS274/NGC interpreter does in either unit). */
export const PECK_CLEARANCE_MM = 0.254
/** Problems listed one by one; the rest are counted. */
const MAX_LISTED_PROBLEMS = 100

export interface NcTool {
  tool: number
  feedDistanceMm: number
  plungeDistanceMm: number
  feedMinutes: number
  estimatedMinutes: number
  rapidMinutes: number
  rapidDistanceMm: number
  maxDepthMm: number
  spindleRpm: number[]
  feedsMmPerMin: number[]
}
export interface NcProblem { line: number, message: string }
export interface NcReading {
  units: 'mm' | 'inch'
  tools: NcTool[]
  problems: NcProblem[]
  lines: number
  moves: number
}
export interface NcReadOptions {
  accelerationMmPerS2?: number
  rapidMmPerMin?: number
  /** The tool already in the spindle, for moves before the program's first tool change. */
  spindleTool?: number
  /** The block-delete switch: when on, lines starting with `/` are skipped (off by default,
   *  as in LinuxCNC's standalone interpreter). */
  blockDelete?: boolean
}

/** The program cannot be read as a whole; nothing of it should be kept. */
export class NcRefusal extends Error {
  readonly line?: number
  /** 'spindleTool': the program cuts before its first tool change; ask which tool is loaded. */
  readonly ask?: 'spindleTool'
  /** What kind of refusal: the file is not a program at all, or the program cannot be read. */
  readonly kind: 'empty' | 'binary' | 'program'
  constructor(message: string, opts: { line?: number, ask?: 'spindleTool', kind?: 'empty' | 'binary' } = {}) {
    super(message)
    this.name = 'NcRefusal'
    this.line = opts.line
    this.ask = opts.ask
    this.kind = opts.kind ?? 'program'
  }
}

interface Acc extends Omit<NcTool, 'spindleRpm' | 'feedsMmPerMin' | 'maxDepthMm'> {
  minZ: number
  rpm: Set<number>
  feeds: Set<number>
}

type Plane = 17 | 18 | 19
type Motion = 0 | 1 | 2 | 3 | 81 | 82 | 83 | null

const WORD_LETTERS = new Set(['G', 'M', 'X', 'Y', 'Z', 'I', 'J', 'K', 'R', 'P', 'Q', 'L', 'F', 'S', 'T', 'H', 'D'])
// A block once comments and spaces are gone: letter-number words only. Anything else
// (parameters #1, expressions [..], O-word subroutines) is not read.
const WORDS_ONLY = /^(?:[A-Za-z][+-]?(?:\d+\.?\d*|\.\d+))*$/
// G codes read with no effect on lengths: cutter compensation off, tool length offset,
// work offsets (lengths are taken in program coordinates), path control, feed per minute.
const NO_EFFECT_G = new Set([40, 43, 49, 54, 55, 56, 57, 58, 59, 59.1, 59.2, 59.3, 61, 61.1, 64, 94])
const UNREAD_G: Record<string, string> = {
  28: 'a return to the stored home position (G28)',
  30: 'a return to the second home position (G30)',
  92: 'a coordinate offset (G92)',
  10: 'a coordinate or tool table setting (G10)',
  93: 'inverse-time feed (G93)',
  95: 'feed per revolution (G95)',
  73: 'a chip-breaking drilling cycle (G73)',
  84: 'a tapping cycle (G84)', 85: 'a boring cycle (G85)', 86: 'a boring cycle (G86)', 87: 'a back-boring cycle (G87)',
  88: 'a boring cycle (G88)', 89: 'a boring cycle (G89)', 33: 'spindle-synchronised motion (G33)', 76: 'a threading cycle (G76)',
}
const KNOWN_M = new Set([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 30])

const round = (v: number) => Math.round(v * 1e6) / 1e6

/** Reads a program's text. Throws NcRefusal for a file that cannot be read as a whole (no moves,
 *  a feed move before any F, an arc whose radius does not fit, cutting before any tool change
 *  when the spindle's tool is not given); lists lines it does not understand as problems. */
export function readNcProgram(text: string, options: NcReadOptions = {}): NcReading {
  const accel = options.accelerationMmPerS2 ?? DEFAULT_ACCELERATION_MM_S2
  const rapidRate = options.rapidMmPerMin ?? DEFAULT_RAPID_MM_PER_MIN
  const problems: NcProblem[] = []
  let unlisted = 0
  const problem = (line: number, message: string) => {
    if (problems.length < MAX_LISTED_PROBLEMS) problems.push({ line, message })
    else unlisted++
  }

  const tools = new Map<number, Acc>()
  const accOf = (tool: number): Acc => {
    let acc = tools.get(tool)
    if (!acc) {
      acc = { tool, feedDistanceMm: 0, plungeDistanceMm: 0, feedMinutes: 0, estimatedMinutes: 0, rapidMinutes: 0, rapidDistanceMm: 0, minZ: Infinity, rpm: new Set(), feeds: new Set() }
      tools.set(tool, acc)
    }
    return acc
  }

  // Modal state. Positions are in millimetres; the program starts at the origin, as the
  // interpreter does with no offsets.
  let x = 0, y = 0, z = 0
  let unit = 1 // mm per program unit
  let programUnits: 'mm' | 'inch' | undefined
  let absolute = true
  let arcAbsolute = false
  let plane: Plane = 17
  let motion: Motion = null
  let retractToR = false
  let feedRaw: number | undefined
  let rpm: number | undefined
  let spindleOn = false
  let selected: number | undefined
  let tool: number | undefined = options.spindleTool
  let cycle: { r?: number, z?: number, q?: number, p?: number } = {}
  let moves = 0
  let feedMoves = 0

  const feedNow = (line: number, what: string): number => {
    if (feedRaw === undefined || !(feedRaw > 0)) {
      throw new NcRefusal(`Line ${line}: ${what} comes before any feed rate (F), so its minutes cannot be known. Add an F word before the first cutting move.`, { line })
    }
    return feedRaw * unit
  }
  const cuttingTool = (line: number): Acc => {
    if (tool === undefined) {
      throw new NcRefusal(`Line ${line} cuts before any tool change (T... M6): say which tool number is already in the spindle, and the program is read again with its moves counted for that tool.`, { line, ask: 'spindleTool' })
    }
    return accOf(tool)
  }
  const rapid = (tx: number, ty: number, tz: number) => {
    const length = Math.hypot(tx - x, ty - y, tz - z)
    if (length > 0 && tool !== undefined) {
      const acc = accOf(tool)
      acc.rapidDistanceMm += length
      acc.rapidMinutes += trapezoidMinutes(length, rapidRate, accel)
    }
    x = tx; y = ty; z = tz
    moves++
  }
  const feedMove = (acc: Acc, length: number, feed: number, lowestZ: number, plunge: boolean) => {
    if (length > 0) {
      acc.feedDistanceMm += length
      if (plunge) acc.plungeDistanceMm += length
      acc.feedMinutes += length / feed
      acc.estimatedMinutes += trapezoidMinutes(length, feed, accel)
    }
    acc.feeds.add(round(feed))
    if (spindleOn && rpm !== undefined) acc.rpm.add(rpm)
    if (lowestZ < acc.minZ) acc.minZ = lowestZ
    moves++
    feedMoves++
  }
  const straightFeed = (line: number, tx: number, ty: number, tz: number, what = 'a feed move (G1)') => {
    const feed = feedNow(line, what)
    const acc = cuttingTool(line)
    const length = Math.hypot(tx - x, ty - y, tz - z)
    const plunge = tz < z && Math.abs(tx - x) < 1e-9 && Math.abs(ty - y) < 1e-9
    feedMove(acc, length, feed, Math.min(z, tz), plunge)
    x = tx; y = ty; z = tz
  }
  const dwell = (seconds: number) => {
    if (tool !== undefined && seconds > 0) accOf(tool).estimatedMinutes += seconds / 60
  }

  const lines = text.split(/\r\n|\r|\n/)
  let ended = false
  for (let i = 0; i < lines.length && !ended; i++) {
    const n = i + 1
    let raw = lines[i]!.trim()
    if (raw === '' || raw[0] === '%' || raw[0] === ';') continue
    if (raw[0] === '(' && raw.indexOf(')') === raw.length - 1) continue
    if (raw[0] === '/') {
      if (options.blockDelete) continue
      raw = raw.slice(1)
    }
    const parsed = parseLine(raw, { lineMode: 'compact' })
    if (parsed.line === '' && parsed.words.length === 0) continue
    if (!WORDS_ONLY.test(parsed.line.replace(/^N\d+/i, ''))) {
      problem(n, `"${raw.slice(0, 60)}" is not read: parameters (#), expressions ([ ]) and subroutines (O words) are outside what Kerfbook reads, so this line's moves are not counted.`)
      continue
    }

    // Gather the block's words.
    const gs: number[] = []
    const ms: number[] = []
    const w: Record<string, number> = {}
    let bad: string | undefined
    for (const [letter, value] of parsed.words) {
      if (typeof value !== 'number' || !Number.isFinite(value)) { bad = `the word ${letter}${value} is not a number`; break }
      if (letter === 'G') gs.push(Math.round(value * 10) / 10)
      else if (letter === 'M') ms.push(Math.round(value))
      else if (!WORD_LETTERS.has(letter)) { bad = `axis or word ${letter} is not read (Kerfbook reads X, Y and Z moves)`; break }
      else if (letter in w) { bad = `the word ${letter} appears twice`; break }
      else w[letter] = value
    }
    if (bad) { problem(n, `${bad}, so this line is not counted.`); continue }

    let lineMotion: Exclude<Motion, null> | 'none' | undefined
    let newPlane: Plane | undefined
    let machineCoords = false
    let dwellSeconds: number | undefined
    for (const g of gs) {
      if (g === 0 || g === 1 || g === 2 || g === 3 || g === 81 || g === 82 || g === 83) {
        if (lineMotion !== undefined) { bad = 'two motion codes in one block'; break }
        lineMotion = g
      } else if (g === 80) {
        if (lineMotion !== undefined) { bad = 'two motion codes in one block'; break }
        lineMotion = 'none'
      } else if (g === 17 || g === 18 || g === 19) newPlane = g
      else if (g === 20 || g === 21) {
        unit = g === 20 ? 25.4 : 1
        programUnits ??= g === 20 ? 'inch' : 'mm'
      } else if (g === 90) absolute = true
      else if (g === 91) absolute = false
      else if (g === 90.1) arcAbsolute = true
      else if (g === 91.1) arcAbsolute = false
      else if (g === 98) retractToR = false
      else if (g === 99) retractToR = true
      else if (g === 4) dwellSeconds = w.P ?? 0
      else if (g === 53) machineCoords = true
      else if (g === 41 || g === 42) problem(n, `cutter radius compensation (G${g}) is not applied: lengths are counted along the programmed path.`)
      else if (NO_EFFECT_G.has(g)) continue
      else if (UNREAD_G[g]) { bad = `${UNREAD_G[g]} is not read`; break }
      else { bad = `G${g} is not a code Kerfbook reads`; break }
    }
    if (bad) { problem(n, `${bad}, so this line's moves are not counted.`); continue }
    for (const m of ms) if (!KNOWN_M.has(m)) problem(n, `M${m} is not a code Kerfbook reads; it is passed over.`)

    // Execution order within a block (RS274/NGC): feed, speed, tool select, tool change,
    // spindle, plane, units, distance modes (already set above), dwell, motion, stop.
    if (w.F !== undefined) feedRaw = w.F
    if (w.S !== undefined) rpm = w.S
    if (w.T !== undefined) selected = Math.round(w.T)
    if (ms.includes(6)) {
      if (selected === undefined) problem(n, 'a tool change (M6) with no tool number (T) chosen before it is passed over.')
      else tool = selected
    }
    if (ms.includes(3) || ms.includes(4)) spindleOn = true
    if (ms.includes(5)) spindleOn = false
    if (newPlane) plane = newPlane
    if (dwellSeconds !== undefined) dwell(dwellSeconds)

    if (lineMotion === 'none') {
      motion = null
      cycle = {}
    } else if (typeof lineMotion === 'number') {
      // Entering a drilling cycle from other motion forgets the last cycle's sticky R, Z, Q and P.
      if ((lineMotion >= 81) !== ((motion ?? 0) >= 81)) cycle = {}
      motion = lineMotion
    }
    const hasAxis = w.X !== undefined || w.Y !== undefined || w.Z !== undefined
    const cycleCalled = lineMotion != null && lineMotion !== 'none' && lineMotion >= 81
    if (hasAxis || cycleCalled) {
      if (motion === null) problem(n, 'axis words with no motion code in effect (G0, G1, G2, G3 or a cycle) are not counted.')
      else if (machineCoords && motion !== 0 && motion !== 1) problem(n, 'G53 with an arc or a cycle is not read, so this line is not counted.')
      else {
        const abs = absolute || machineCoords
        const tx = w.X === undefined ? x : (abs ? w.X * unit : x + w.X * unit)
        const ty = w.Y === undefined ? y : (abs ? w.Y * unit : y + w.Y * unit)
        const tz = w.Z === undefined ? z : (abs ? w.Z * unit : z + w.Z * unit)
        if (motion === 0) rapid(tx, ty, tz)
        else if (motion === 1) straightFeed(n, tx, ty, tz)
        else if (motion === 2 || motion === 3) arc(n, motion === 3, tx, ty, tz, w)
        else drill(n, motion, w)
      }
    }
    if (ms.includes(2) || ms.includes(30)) ended = true
  }

  function arc(line: number, ccw: boolean, tx: number, ty: number, tz: number, w: Record<string, number>) {
    const feed = feedNow(line, `an arc (G${ccw ? 3 : 2})`)
    const acc = cuttingTool(line)
    // The plane's (first, second) axes and the linear one: XY with Z, ZX with Y, YZ with X, so
    // that G2 is clockwise seen from the positive end of the third axis in each.
    const [a0, b0, a1, b1, l0, l1] = plane === 17 ? [x, y, tx, ty, z, tz] : plane === 18 ? [z, x, tz, tx, y, ty] : [y, z, ty, tz, x, tx]
    const [ci, cj] = plane === 17 ? ['I', 'J'] : plane === 18 ? ['K', 'I'] : ['J', 'K']
    let ca: number, cb: number
    if (w.R !== undefined) {
      if (w[ci] !== undefined || w[cj] !== undefined) throw new NcRefusal(`Line ${line}: an arc gives both a radius (R) and a centre (I, J, K); give one.`, { line })
      const r = Math.abs(w.R * unit)
      const chord = Math.hypot(a1 - a0, b1 - b0)
      if (chord < 1e-9) throw new NcRefusal(`Line ${line}: an arc given by its radius (R) ends where it starts; a full circle needs its centre (I, J, K).`, { line })
      const half = chord / 2
      if (r < half - Math.max(0.0005, 1e-5 * half)) {
        throw new NcRefusal(`Line ${line}: the arc's radius R${w.R} is too small for its end points, which lie ${fmt(chord / unit)} apart (the radius must be at least half that).`, { line })
      }
      const h = Math.sqrt(Math.max(0, r * r - half * half))
      const side = (ccw ? 1 : -1) * (w.R > 0 ? 1 : -1)
      ca = (a0 + a1) / 2 - side * h * (b1 - b0) / chord
      cb = (b0 + b1) / 2 + side * h * (a1 - a0) / chord
    } else {
      if (w[ci] === undefined && w[cj] === undefined) throw new NcRefusal(`Line ${line}: an arc gives neither a centre (${ci}, ${cj}) nor a radius (R) for its plane.`, { line })
      const oi = (w[ci] ?? 0) * unit
      const oj = (w[cj] ?? 0) * unit
      ca = arcAbsolute ? oi : a0 + oi
      cb = arcAbsolute ? oj : b0 + oj
      const r0 = Math.hypot(a0 - ca, b0 - cb)
      const r1 = Math.hypot(a1 - ca, b1 - cb)
      const diff = Math.abs(r1 - r0)
      if (r0 < 1e-9 || (diff > 0.002 && diff > 0.001 * r0) || diff > 0.5) {
        throw new NcRefusal(`Line ${line}: the arc's radius does not fit its end points: ${fmt(r0 / unit)} from the centre at the start, ${fmt(r1 / unit)} at the end.`, { line })
      }
    }
    const radius = Math.hypot(a0 - ca, b0 - cb)
    const sweep = sweepAngle(a0, b0, a1, b1, ca, cb, ccw, w.P ?? 1)
    const length = helixLength(radius, sweep, l1 - l0)
    let lowest = Math.min(z, tz)
    const start = Math.atan2(b0 - cb, a0 - ca)
    // Z is the first axis of the ZX plane (its low side at angle π) and the second of YZ (−π/2).
    if (plane === 18 && arcPassesAngle(start, sweep, ccw, Math.PI)) lowest = Math.min(lowest, ca - radius)
    if (plane === 19 && arcPassesAngle(start, sweep, ccw, -Math.PI / 2)) lowest = Math.min(lowest, cb - radius)
    feedMove(acc, length, feed, lowest, false)
    x = tx; y = ty; z = tz
  }

  function drill(line: number, kind: 81 | 82 | 83, w: Record<string, number>) {
    if (plane !== 17) { problem(line, `a drilling cycle (G${kind}) outside the XY plane (G17) is not read, so it is not counted.`); return }
    if (w.R !== undefined) cycle.r = w.R
    if (w.Z !== undefined) cycle.z = w.Z
    if (w.Q !== undefined) cycle.q = w.Q
    if (w.P !== undefined) cycle.p = w.P
    if (cycle.r === undefined || cycle.z === undefined) { problem(line, `a drilling cycle (G${kind}) without its R and Z is not counted.`); return }
    if (kind === 83 && !(cycle.q !== undefined && cycle.q > 0)) { problem(line, 'a peck drilling cycle (G83) without a positive peck depth Q is not counted.'); return }
    feedNow(line, `a drilling cycle (G${kind})`)
    cuttingTool(line)
    const repeats = w.L === undefined ? 1 : Math.max(0, Math.round(w.L))
    // In G91, R is measured from the Z where the cycle starts and Z from R; X and Y step per repeat.
    const r = absolute ? cycle.r * unit : z + cycle.r * unit
    const bottom = absolute ? cycle.z * unit : r + cycle.z * unit
    const q = (cycle.q ?? 0) * unit
    for (let k = 0; k < repeats; k++) {
      const hx = w.X === undefined ? x : (absolute ? w.X * unit : x + w.X * unit)
      const hy = w.Y === undefined ? y : (absolute ? w.Y * unit : y + w.Y * unit)
      const clear = retractToR ? r : Math.max(z, r)
      if (z < r) rapid(x, y, r)
      rapid(hx, hy, z)
      rapid(hx, hy, r)
      if (kind === 83) {
        let depth = r - q
        while (depth > bottom) {
          straightFeed(line, hx, hy, depth, 'a drilling cycle (G83)')
          rapid(hx, hy, r)
          rapid(hx, hy, depth + PECK_CLEARANCE_MM)
          depth -= q
        }
      }
      straightFeed(line, hx, hy, bottom, `a drilling cycle (G${kind})`)
      if (kind === 82) dwell(cycle.p ?? 0)
      rapid(hx, hy, clear)
    }
  }

  if (feedMoves === 0) {
    throw new NcRefusal(lines.length > 1
      ? `The file has ${lines.length.toLocaleString('en-US')} lines but not one cutting move (G1, G2, G3 or a drilling cycle), so there is nothing to count.`
      : 'The file has not one cutting move (G1, G2, G3 or a drilling cycle), so there is nothing to count.')
  }
  if (unlisted > 0) problems.push({ line: problems.at(-1)!.line, message: `and ${unlisted} more lines not read.` })

  return {
    units: programUnits ?? 'mm',
    lines: lines.length,
    moves,
    problems,
    tools: [...tools.values()].sort((a, b) => a.tool - b.tool).map((a) => ({
      tool: a.tool,
      feedDistanceMm: a.feedDistanceMm,
      plungeDistanceMm: a.plungeDistanceMm,
      feedMinutes: a.feedMinutes,
      estimatedMinutes: a.estimatedMinutes,
      rapidMinutes: a.rapidMinutes,
      rapidDistanceMm: a.rapidDistanceMm,
      maxDepthMm: Number.isFinite(a.minZ) ? Math.max(0, -a.minZ) : 0,
      spindleRpm: [...a.rpm].sort((p, q) => p - q),
      feedsMmPerMin: [...a.feeds].sort((p, q) => p - q),
    })),
  }
}

const fmt = (v: number) => String(Math.round(v * 10000) / 10000)
