// Per-tool totals worked out from the canonical machining commands of LinuxCNC's standalone
// RS274/NGC interpreter, `rs274` (Debian package linuxcnc-uspace; NIST RS274/NGC Interpreter,
// Version 3 lineage): the oracle the program reader is checked against. The interpreter resolves
// units, modes, arc centres given by radius and drilling cycles into STRAIGHT_TRAVERSE,
// STRAIGHT_FEED and ARC_FEED in the program's units; lengths here come from those moves alone.
// Arc length is |sweep| × radius, a helix √(arc² + axis²); depth is sampled along each arc.
import { execFileSync } from 'node:child_process'

export interface OracleTool {
  tool: number
  feedDistanceMm: number
  plungeDistanceMm: number
  feedMinutes: number
  estimatedMinutes: number
  rapidDistanceMm: number
  rapidMinutes: number
  minZMm: number
}

/** The constant-acceleration (trapezoidal) time of one move that starts and stops at rest, in
 *  minutes: cruise when L ≥ v²/a, else a triangle, 2·√(L/a). Written here from the kinematics
 *  on its own, not taken from the reader. */
function rampedMinutes(lengthMm: number, feedMmPerMin: number, accel: number): number {
  if (lengthMm <= 0) return 0
  const v = feedMmPerMin / 60
  const seconds = lengthMm >= v * v / accel ? lengthMm / v + v / accel : 2 * Math.sqrt(lengthMm / accel)
  return seconds / 60
}

export function runRs274(programPath: string, toolTable: string, opts: { blockDelete?: boolean } = {}): string {
  const args = ['-t', toolTable, '-g', ...(opts.blockDelete ? ['-b'] : []), programPath]
  return execFileSync('rs274', args, { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] })
}

export function oracleTotals(canon: string, opts: { accelMmPerS2: number, rapidMmPerMin: number }): Map<number, OracleTool> {
  const tools = new Map<number, OracleTool>()
  let scale = 1
  let plane = 'XY'
  let feed = 0
  let selected = 0
  let tool: OracleTool | undefined
  let pos = [0, 0, 0]
  const num = (s: string) => s.split(',').map((v) => Number(v.trim()))
  for (const line of canon.split('\n')) {
    const m = /^\s*\d+\s+N[.\d]*\s+([A-Z_]+)\((.*)\)\s*$/.exec(line)
    if (!m) continue
    const [, cmd, args] = m as unknown as [string, string, string]
    if (cmd === 'USE_LENGTH_UNITS') scale = args.includes('INCHES') ? 25.4 : 1
    else if (cmd === 'SELECT_PLANE') plane = args.replace('CANON_PLANE_', '')
    else if (cmd === 'SET_FEED_RATE') feed = Number(args) * scale
    else if (cmd === 'SELECT_TOOL') selected = Number(args)
    else if (cmd === 'CHANGE_TOOL') {
      // CHANGE_TOOL prints the tool table's slot; the tool number is the one selected.
      tool = tools.get(selected) ?? { tool: selected, feedDistanceMm: 0, plungeDistanceMm: 0, feedMinutes: 0, estimatedMinutes: 0, rapidDistanceMm: 0, rapidMinutes: 0, minZMm: Infinity }
      tools.set(selected, tool)
    } else if (cmd === 'DWELL') {
      if (tool) tool.estimatedMinutes += Number(args) / 60
    } else if (cmd === 'STRAIGHT_TRAVERSE' || cmd === 'STRAIGHT_FEED') {
      const [ex, ey, ez] = num(args).slice(0, 3).map((v) => v * scale) as [number, number, number]
      const length = Math.hypot(ex - pos[0]!, ey - pos[1]!, ez - pos[2]!)
      if (tool && cmd === 'STRAIGHT_TRAVERSE') {
        tool.rapidDistanceMm += length
        tool.rapidMinutes += rampedMinutes(length, opts.rapidMmPerMin, opts.accelMmPerS2)
      } else if (tool) {
        tool.feedDistanceMm += length
        if (ez < pos[2]! && ex === pos[0] && ey === pos[1]) tool.plungeDistanceMm += length
        tool.feedMinutes += length / feed
        tool.estimatedMinutes += rampedMinutes(length, feed, opts.accelMmPerS2)
        tool.minZMm = Math.min(tool.minZMm, pos[2]!, ez)
      }
      pos = [ex, ey, ez]
    } else if (cmd === 'ARC_FEED') {
      const [fe, se, fc, sc, rot, ae] = num(args).map((v, i) => (i === 4 ? v : v * scale)) as [number, number, number, number, number, number]
      // The plane's (first, second, axis) as indices of (x, y, z).
      const [fi, si, ai] = plane === 'XY' ? [0, 1, 2] : plane === 'XZ' ? [2, 0, 1] : [1, 2, 0]
      const f0 = pos[fi]!, s0 = pos[si]!, a0 = pos[ai]!
      const r = Math.hypot(f0 - fc, s0 - sc)
      const t0 = Math.atan2(s0 - sc, f0 - fc)
      let t1 = Math.atan2(se - sc, fe - fc)
      if (rot > 0) { while (t1 <= t0 + 1e-12) t1 += 2 * Math.PI } else { while (t1 >= t0 - 1e-12) t1 -= 2 * Math.PI }
      const sweep = Math.abs(t1 - t0) + 2 * Math.PI * (Math.abs(rot) - 1)
      const length = Math.hypot(sweep * r, ae - a0)
      if (tool) {
        tool.feedDistanceMm += length
        tool.feedMinutes += length / feed
        tool.estimatedMinutes += rampedMinutes(length, feed, opts.accelMmPerS2)
        // Deepest point: sample the arc (with its helix) finely.
        const end = [0, 0, 0]
        end[fi] = fe; end[si] = se; end[ai] = ae
        const dir = rot > 0 ? 1 : -1
        for (let k = 0; k <= 2000; k++) {
          const t = t0 + dir * sweep * (k / 2000)
          const p = [0, 0, 0]
          p[fi] = fc + r * Math.cos(t); p[si] = sc + r * Math.sin(t); p[ai] = a0 + (ae - a0) * (k / 2000)
          tool.minZMm = Math.min(tool.minZMm, p[2]!)
        }
      }
      const next = [0, 0, 0]
      next[fi] = fe; next[si] = se; next[ai] = ae
      pos = next
    }
  }
  return tools
}
