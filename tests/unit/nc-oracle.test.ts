// The program reader against LinuxCNC's standalone RS274/NGC interpreter `rs274` (Debian package
// linuxcnc-uspace; T. R. Kramer, F. M. Proctor, E. Messina, "The NIST RS274NGC Interpreter -
// Version 3", NISTIR 6556, 2000, is the semantics it carries). rs274 turns each program into
// canonical moves; tests/support/rs274.ts adds those up per tool. The programs in
// tests/fixtures/nc cover millimetres and inches, the three planes, arcs by centre and by radius,
// full circles and helices, absolute and incremental distances, G81/G82/G83 with G98/G99 and
// repeats, tool changes on the same and on separate lines, S with M3/M4/M5, modal feed, both
// comment styles, line numbers, block delete, % lines and program end. `npm test` installs
// linuxcnc-uspace where rs274 is missing.
import { readFileSync } from 'node:fs'
import path from 'node:path'
import { describe, expect, it } from 'vitest'
import { readNcProgram } from '../../shared/kerf/nc/read'
import { oracleTotals, runRs274 } from '../support/rs274'

const dir = path.resolve(import.meta.dirname, '../fixtures/nc') + path.sep
const TOOLS = `${dir}tools.tbl`
const PROGRAMS = ['metric-xy.ngc', 'inch-planes.ngc', 'cycles.ngc']
const SETTINGS = [
  { accelerationMmPerS2: 1000, rapidMmPerMin: 10_000 },
  { accelerationMmPerS2: 250, rapidMmPerMin: 20_000 },
]

/** Within 0.1 % of the oracle (the tolerance), or 1e-9 when the oracle's figure is 0. */
function expectWithinTenthPercent(ours: number, oracle: number, what: string) {
  const allowed = Math.max(1e-9, Math.abs(oracle) * 0.001)
  expect(Math.abs(ours - oracle), `${what}: ours ${ours}, rs274 ${oracle}`).toBeLessThanOrEqual(allowed)
}

describe('per-tool totals agree with rs274 within 0.1 %', () => {
  for (const name of PROGRAMS) {
    for (const blockDelete of [false, true]) {
      for (const s of SETTINGS) {
        it(`${name}, block delete ${blockDelete ? 'on' : 'off'}, ${s.accelerationMmPerS2} mm/s², rapids ${s.rapidMmPerMin} mm/min`, () => {
          const ours = readNcProgram(readFileSync(`${dir}${name}`, 'utf8'), { ...s, blockDelete })
          const oracle = oracleTotals(runRs274(`${dir}${name}`, TOOLS, { blockDelete }), { accelMmPerS2: s.accelerationMmPerS2, rapidMmPerMin: s.rapidMmPerMin })
          expect(ours.problems).toEqual([])
          expect(ours.tools.map((t) => t.tool)).toEqual([...oracle.keys()].sort((a, b) => a - b))
          for (const t of ours.tools) {
            const o = oracle.get(t.tool)!
            expect(o.feedDistanceMm).toBeGreaterThan(0)
            expectWithinTenthPercent(t.feedDistanceMm, o.feedDistanceMm, `T${t.tool} feed distance`)
            expectWithinTenthPercent(t.feedMinutes, o.feedMinutes, `T${t.tool} minutes at feed`)
            expectWithinTenthPercent(t.estimatedMinutes, o.estimatedMinutes, `T${t.tool} minutes with acceleration`)
            expectWithinTenthPercent(t.plungeDistanceMm, o.plungeDistanceMm, `T${t.tool} plunge distance`)
            expectWithinTenthPercent(t.rapidDistanceMm, o.rapidDistanceMm, `T${t.tool} rapid distance`)
            expectWithinTenthPercent(t.rapidMinutes, o.rapidMinutes, `T${t.tool} rapid minutes`)
            // Depth from the arc sampled at 2,000 points: within a thousandth of a millimetre.
            expect(Math.abs(t.maxDepthMm - Math.max(0, -o.minZMm)), `T${t.tool} depth`).toBeLessThanOrEqual(0.001)
          }
        })
      }
    }
  }

  it('block delete changes what the metric program cuts (the switch is read, not ignored)', () => {
    const text = readFileSync(`${dir}metric-xy.ngc`, 'utf8')
    const off = readNcProgram(text).tools[0]!.feedDistanceMm
    const on = readNcProgram(text, { blockDelete: true }).tools[0]!.feedDistanceMm
    const oracleOff = oracleTotals(runRs274(`${dir}metric-xy.ngc`, TOOLS), { accelMmPerS2: 1000, rapidMmPerMin: 10_000 }).get(1)!.feedDistanceMm
    const oracleOn = oracleTotals(runRs274(`${dir}metric-xy.ngc`, TOOLS, { blockDelete: true }), { accelMmPerS2: 1000, rapidMmPerMin: 10_000 }).get(1)!.feedDistanceMm
    expect(Math.abs(oracleOff - oracleOn)).toBeGreaterThan(1)
    expectWithinTenthPercent(off - on, oracleOff - oracleOn, 'the deleted block')
  })
})

describe('a hand-checked arc', () => {
  it('a half circle of radius 10 mm at 1,200 mm/min is 31.4159 mm and 0.026180 min, by centre and by radius', () => {
    // π × 10 = 31.4159 mm; ÷ 1200 = 0.026180 min [computed from the arc-length formula].
    for (const arc of ['G2 X20 Y0 I10 J0', 'G2 X20 Y0 R10', 'G3 X20 Y0 R-10']) {
      const t = readNcProgram(`G21 G90 G17\nT1 M6\nG1 X0 Y0 Z-1 F1200\n${arc}\nM30\n`).tools[0]!
      expect(t.feedDistanceMm - 1).toBeCloseTo(31.4159, 4)
      expect(t.feedMinutes - 1 / 1200).toBeCloseTo(0.026180, 6)
    }
  })
})
