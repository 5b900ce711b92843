// The program reader's own promises: the trapezoidal time of a move against hand-worked
// kinematics, and bad input answered with a sentence (a binary file, an empty one, a program
// with no tool change, a feed move before any F, an arc whose radius does not fit, a million
// lines of comments), and what it does not understand listed by line rather than guessed.
import { describe, expect, it } from 'vitest'
import { NcRefusal, readNcProgram } from '../../shared/kerf/nc/read'
import { trapezoidMinutes } from '../../shared/kerf/nc/motion'
import { programText } from '../../shared/kerf/nc/text'

const refusal = (fn: () => unknown): NcRefusal => {
  try { fn() } catch (e) { if (e instanceof NcRefusal) return e; throw e }
  throw new Error('expected the reader to refuse')
}

describe('minutes with the machine\'s acceleration (constant-acceleration kinematics)', () => {
  it('a long move cruises: L/v + v/a', () => {
    // 100 mm at 6,000 mm/min (100 mm/s), a = 1,000 mm/s²: 100/100 + 100/1000 = 1.1 s [computed].
    expect(trapezoidMinutes(100, 6000, 1000) * 60).toBeCloseTo(1.1, 12)
  })
  it('a short move never reaches full feed: 2·√(L/a)', () => {
    // 1 mm at 100 mm/s needs v²/a = 10 mm to reach full feed; it takes 2·√(1/1000) = 0.063246 s [computed].
    expect(trapezoidMinutes(1, 6000, 1000) * 60).toBeCloseTo(0.0632456, 6)
    expect(trapezoidMinutes(1, 6000, 1000)).toBeGreaterThan(1 / 6000)
  })
  it('the two cases meet at L = v²/a', () => {
    // At L = 10 mm: 10/100 + 100/1000 = 0.2 s = 2·√(10/1000) [computed].
    expect(trapezoidMinutes(10, 6000, 1000) * 60).toBeCloseTo(0.2, 12)
  })
  it('a program of short segments takes longer than its minutes at feed, and less so with a quicker machine', () => {
    const zigzag = ['G21 G90', 'T1 M6', 'G1 Z-1 F3000', ...Array.from({ length: 200 }, (_, i) => `X${(i % 2) * 0.5} Y${i * 0.5}`), 'M30'].join('\n')
    const slow = readNcProgram(zigzag, { accelerationMmPerS2: 500 }).tools[0]!
    const quick = readNcProgram(zigzag, { accelerationMmPerS2: 5000 }).tools[0]!
    expect(slow.estimatedMinutes).toBeGreaterThan(quick.estimatedMinutes)
    expect(quick.estimatedMinutes).toBeGreaterThan(quick.feedMinutes)
  })
})

describe('per-tool readings', () => {
  it('collects the spindle speeds and feeds each tool runs at, in mm/min, and its deepest cut', () => {
    const r = readNcProgram('G20 G90\nT2 M6\nS12000 M3\nG1 Z-0.25 F20\nX1 F100\nS15000\nX2\nM30')
    expect(r.units).toBe('inch')
    expect(r.tools[0]).toMatchObject({ tool: 2, spindleRpm: [12000, 15000], feedsMmPerMin: [508, 2540] })
    expect(r.tools[0]!.maxDepthMm).toBeCloseTo(6.35, 9)
    expect(r.tools[0]!.plungeDistanceMm).toBeCloseTo(6.35, 9)
  })
  it('counts no spindle speed while the spindle is stopped', () => {
    const r = readNcProgram('G21\nT1 M6\nS18000\nG1 X10 F1000\nM3\nG1 X20\nM30')
    expect(r.tools[0]!.spindleRpm).toEqual([18000])
  })
  it('stops at program end', () => {
    const r = readNcProgram('G21\nT1 M6\nG1 X10 F1000\nM30\nG1 X500\n')
    expect(r.tools[0]!.feedDistanceMm).toBeCloseTo(10, 9)
  })
})

describe('bad input answers with a sentence', () => {
  it('an empty file', () => {
    expect(refusal(() => programText(new Uint8Array())).message).toMatch(/^The file is empty/)
    expect(refusal(() => programText(new TextEncoder().encode(' \n\r\n'))).message).toMatch(/^The file is empty/)
  })
  it('a binary file', () => {
    const png = new Uint8Array([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A, 0, 0, 0, 13])
    expect(refusal(() => programText(png)).message).toMatch(/^This is not an NC program: it holds binary data \(byte 7/)
  })
  it('text with Latin-1 comments is still a program', () => {
    const bytes = new Uint8Array([...new TextEncoder().encode('(90'), 0xB0, ...new TextEncoder().encode(' V-bit)\nG1 X1\n')])
    expect(programText(bytes)).toBe('(90\u00B0 V-bit)\nG1 X1\n')
  })
  it('a program with no tool change asks which tool is in the spindle, and counts its moves for it once told', () => {
    const program = '%\nG21 G90\nS18000 M3\nG0 X0 Y0 Z5\nG1 Z-2 F300\nX50 F1200\nM30\n%'
    const e = refusal(() => readNcProgram(program))
    expect(e.ask).toBe('spindleTool')
    expect(e.line).toBe(5)
    expect(e.message).toMatch(/^Line 5 cuts before any tool change .* which tool number is already in the spindle/)
    const r = readNcProgram(program, { spindleTool: 7 })
    expect(r.tools.map((t) => t.tool)).toEqual([7])
    expect(r.tools[0]!.feedDistanceMm).toBeCloseTo(57, 9)
  })
  it('a feed move before any F', () => {
    const e = refusal(() => readNcProgram('G21\nT1 M6\nG0 Z5\nG1 Z-1\nG1 X10 F500'))
    expect(e.line).toBe(4)
    expect(e.message).toBe('Line 4: a feed move (G1) comes before any feed rate (F), so its minutes cannot be known. Add an F word before the first cutting move.')
    expect(refusal(() => readNcProgram('G21\nT1 M6\nG81 X1 Y1 Z-3 R2')).message).toMatch(/^Line 3: a drilling cycle \(G81\) comes before any feed rate/)
  })
  it('an arc whose radius does not fit its end points, by radius and by centre', () => {
    const byR = refusal(() => readNcProgram('G21\nT1 M6\nG1 X0 Y0 F900\nG2 X20 Y0 R5'))
    expect(byR.message).toBe('Line 4: the arc\'s radius R5 is too small for its end points, which lie 20 apart (the radius must be at least half that).')
    const byCentre = refusal(() => readNcProgram('G21\nT1 M6\nG1 X0 Y0 F900\nG2 X20 Y0 I5 J0'))
    expect(byCentre.message).toBe('Line 4: the arc\'s radius does not fit its end points: 5 from the centre at the start, 15 at the end.')
    expect(refusal(() => readNcProgram('G21\nT1 M6\nG1 X0 Y0 F900\nG2 X0 Y0 R5')).message).toMatch(/a full circle needs its centre/)
  })
  it('a million lines of comments: no moves, refused without a pathological wait', { timeout: 60_000 }, () => {
    const text = Array.from({ length: 1_000_000 }, (_, i) => (i % 2 ? `(comment ${i})` : `; note ${i}`)).join('\n')
    const started = performance.now()
    const e = refusal(() => readNcProgram(text))
    expect(e.message).toBe('The file has 1,000,000 lines but not one cutting move (G1, G2, G3 or a drilling cycle), so there is nothing to count.')
    expect(performance.now() - started).toBeLessThan(20_000)
  })
  it('rapids alone are not a program to count', () => {
    expect(refusal(() => readNcProgram('G21\nT1 M6\nG0 X10\nG0 Z5\nM30')).message).toMatch(/not one cutting move/)
  })
})

describe('what the reader does not understand is listed by line, not guessed', () => {
  it('parameters, expressions, subroutines, other axes, unread codes', () => {
    const program = [
      'G21 G90', //             1
      'T1 M6', //               2
      'G1 X10 F1000', //        3
      '#1 = 5', //              4
      'G1 X[#1 * 2]', //        5
      'O100 sub', //            6
      'G1 X20 A90', //          7
      'G28', //                 8
      'G41 D1 G1 X30', //       9
      'M101', //               10
      'G1 X40 X50', //         11
      'G84 X1 Y1 Z-5 R2', //   12
      'M30',
    ].join('\n')
    const r = readNcProgram(program)
    expect(r.problems.map((p) => p.line)).toEqual([4, 5, 6, 7, 8, 9, 10, 11, 12])
    expect(r.problems.find((p) => p.line === 7)!.message).toMatch(/axis or word A is not read/)
    expect(r.problems.find((p) => p.line === 9)!.message).toMatch(/cutter radius compensation \(G41\) is not applied/)
    // Counted: X0→10 and, with compensation noted, X10→30; nothing from the lines not read.
    expect(r.tools[0]!.feedDistanceMm).toBeCloseTo(30, 9)
  })
  it('lists a hundred problems and counts the rest', () => {
    const program = ['G21', 'T1 M6', 'G1 X1 F100', ...Array.from({ length: 150 }, () => 'G1 X2 B5'), 'M30'].join('\n')
    const r = readNcProgram(program)
    expect(r.problems).toHaveLength(101)
    expect(r.problems.at(-1)!.message).toBe('and 50 more lines not read.')
  })
})
