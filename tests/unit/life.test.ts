// Life used follows the Palmgren–Miner linear damage rule: a cutter that spends t_i minutes in
// conditions whose whole life is T_i has used Σ t_i / T_i of its life and is worn out at 1.
// Here T_i = rated life × life scale / wear factor of the material.
import { describe, expect, it } from 'vitest'
import { lifeAdded, lifePercent, lifeTone, lifeUsed, remainingMinutes, roundLife } from '../../shared/kerf/life'

describe('life used (Palmgren–Miner linear damage accumulation)', () => {
  it('matches a worked example computed by hand', () => {
    // Rated life 600 min in the reference material. Cuts:
    //   120 min in MDF (wear 1.0)            → 120 × 1.0 / 600 = 0.2
    //    90 min in aluminium composite (2.0) →  90 × 2.0 / 600 = 0.3
    //    60 min in HDPE (0.5)                →  60 × 0.5 / 600 = 0.05
    // Total 0.55; remaining in MDF = 0.45 × 600 / 1.0 = 270 min, in composite 135 min.
    const cuts = [
      { minutes: 120, wearFactor: 1.0 },
      { minutes: 90, wearFactor: 2.0 },
      { minutes: 60, wearFactor: 0.5 },
    ]
    expect(lifeUsed(cuts, 600)).toBeCloseTo(0.55, 12)
    expect(remainingMinutes(0.55, 600, 1.0)).toBeCloseTo(270, 9)
    expect(remainingMinutes(0.55, 600, 2.0)).toBeCloseTo(135, 9)
  })

  it('does not depend on the order of the cuts (the rule is linear)', () => {
    const cuts = [{ minutes: 33, wearFactor: 1.7 }, { minutes: 5, wearFactor: 0.4 }, { minutes: 210, wearFactor: 1.1 }]
    expect(lifeUsed(cuts, 1200)).toBeCloseTo(lifeUsed([...cuts].reverse(), 1200), 12)
  })

  it('a cutter is worn out when the sum reaches 1: a full rated life in the reference material', () => {
    expect(lifeAdded(900, 1, 900)).toBe(1)
    expect(remainingMinutes(1, 900, 1)).toBe(0)
    expect(remainingMinutes(1.3, 900, 1)).toBe(0)
  })

  it('a reground cutter\'s life is the rated life scaled by the regrind life fraction', () => {
    // With a fraction of 0.8 a 600-minute type gives 480 minutes after a regrind:
    // 240 minutes of MDF use half of it.
    expect(lifeAdded(240, 1, 600, 0.8)).toBeCloseTo(0.5, 12)
    expect(remainingMinutes(0.5, 600, 1, 0.8)).toBeCloseTo(240, 9)
  })

  it('refuses inputs that have no physical meaning', () => {
    expect(() => lifeAdded(-1, 1, 600)).toThrow(RangeError)
    expect(() => lifeAdded(10, 0, 600)).toThrow(RangeError)
    expect(() => lifeAdded(10, 1, 0)).toThrow(RangeError)
  })

  it('rounds the way the database stores it', () => {
    expect(roundLife(0.1234564)).toBe(0.123456)
    expect(roundLife(0.1234566)).toBe(0.123457)
  })
})

// Both life bars (the phone's and the crib's) show these, so one bit reads the same everywhere.
describe('the life bars\' figure and tone', () => {
  it('rounds down to a whole percent, so the figure never reaches the mark before the tone does', () => {
    // By hand: 0.896 of a life is 89.6 %, shown as 89 %, still short of a 0.9 mark.
    expect(lifePercent(0.896)).toBe(89)
    expect(lifeTone(0.896, 0.9)).toBe('ok')
    expect(lifePercent(0.5699)).toBe(56)
    // 0.57 × 100 is 56.99999… in binary floating point; it still shows 57.
    expect(lifePercent(0.57)).toBe(57)
    expect(lifePercent(-0.1)).toBe(0)
  })

  it('is due from the shop\'s threshold on and past only beyond a whole life', () => {
    expect(lifeTone(0.9, 0.9)).toBe('due')
    expect(lifeTone(0.75, 0.75)).toBe('due')
    expect(lifeTone(0.8, 0.75)).toBe('due')
    expect(lifeTone(1, 0.9)).toBe('due')
    expect(lifeTone(1.0001, 0.9)).toBe('past')
    expect(lifePercent(1.25)).toBe(125)
  })
})
