// The text learned wear reads its sharp lives from (a line a life, the minutes by material as
// PostgreSQL prints a jsonb object), scanned by hand for speed: every number must come out exactly
// as JavaScript's own readers give it (JSON.parse for the object, Number for the rest).
import { describe, expect, it } from 'vitest'
import { mulberry32 } from '../../server/db/seed/demo-history'
import { parseLifeLines } from '../../server/utils/insights/sharp-lives'

/** A decimal as numeric prints it: `digits` digits of which `decimals` after the point. */
function decimal(rand: () => number, digits: number, decimals: number) {
  let s = String(1 + Math.floor(rand() * 9))
  for (let d = 1; d < digits; d++) s += String(Math.floor(rand() * 10))
  return decimals ? `${s.slice(0, digits - decimals) || '0'}.${s.slice(digits - decimals)}` : s
}

describe('reading the sharp lives\' text', () => {
  it('reads every number exactly as JSON.parse and Number do, long quotients included', () => {
    const rand = mulberry32(21)
    const lines: string[] = []
    const expected: Array<{ type: number, worn: number, rated: number, cuts: Record<string, number> }> = []
    for (let n = 0; n < 2000; n++) {
      const type = 1 + Math.floor(rand() * 40000)
      const worn = rand() < 0.7 ? 1 : 0
      // A numeric quotient prints up to 20 significant digits; minutes two decimals.
      const rated = decimal(rand, 1 + Math.floor(rand() * 20), Math.floor(rand() * 3) === 0 ? 0 : 1 + Math.floor(rand() * 14))
      const pairs = Array.from({ length: Math.floor(rand() * 13) }, (_, i) => `"${10 + 3 * i + Math.floor(rand() * 3)}": ${decimal(rand, 1 + Math.floor(rand() * 8), Math.floor(rand() * 3))}`)
      const json = `{${pairs.join(', ')}}`
      lines.push(`${type} ${worn} ${rated} ${json}`)
      expected.push({ type, worn, rated: Number(rated), cuts: JSON.parse(json) as Record<string, number> })
    }
    const lives = parseLifeLines(lines.join('\n'))
    expect(lives.typeId.length).toBe(expected.length)
    expected.forEach((e, i) => {
      expect(lives.typeId[i]).toBe(e.type)
      expect(lives.wornOut[i]).toBe(e.worn)
      expect(lives.ratedLifeMinutes[i]).toBe(e.rated)
      const ids: number[] = [], minutes: number[] = []
      for (let q = lives.start[i]!; q < lives.start[i + 1]!; q++) { ids.push(lives.materialId[q]!); minutes.push(lives.minutes[q]!) }
      expect(ids).toEqual(Object.keys(e.cuts).map(Number))
      expect(minutes).toEqual(Object.values(e.cuts))
    })
  })

  it('leaves out lives with no rated life, keeps lives with no minutes, and reads nothing from nothing', () => {
    const lives = parseLifeLines('7 1 0 {"3": 12.5}\n8 0 600.5 {}\n9 1 480 {"3": 1.25, "4": 2}')
    expect([...lives.typeId]).toEqual([8, 9])
    expect([...lives.wornOut]).toEqual([0, 1])
    expect([...lives.ratedLifeMinutes]).toEqual([600.5, 480])
    expect([...lives.start]).toEqual([0, 0, 2])
    expect([...lives.materialId]).toEqual([3, 4])
    expect([...lives.minutes]).toEqual([1.25, 2])
    expect(parseLifeLines('').typeId.length).toBe(0)
  })

  it('refuses a text that is not lines of lives', () => {
    expect(() => parseLifeLines('7 1 480 {"3": null}')).toThrow(/unexpected "n"/)
    expect(() => parseLifeLines('7 1')).toThrow(/has 2 numbers/)
    expect(() => parseLifeLines('7 1 480 {"3": }')).toThrow(/has 4 numbers/)
  })
})
