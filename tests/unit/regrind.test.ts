// What a cutter back from the regrinder becomes (docs/domain.md, computation 2, at receipt). The
// figures are common practice (docs/domain.md, computation 2; from memory): solid-carbide router
// bits take 2-3 regrinds, each removing roughly 0.1-0.25 mm of diameter.
import { describe, expect, it } from 'vitest'
import { retireCause } from '../../shared/kerf/due'
import { afterRegrind, expectedDiameterMm, receiptSentence, receiptVerdict, retireSentence, roundMm } from '../../shared/kerf/regrind'

const type = { maxRegrinds: 2, minUsableDiameterMm: 6.0 }

describe('receiving a cutter back from the regrinder', () => {
  it('exactly the minimum usable diameter is still usable', () => {
    expect(receiptVerdict(6.0, 0, type)).toEqual({ result: 'reground', cause: null })
  })

  it('0.001 mm below the minimum is retired as undersize', () => {
    expect(receiptVerdict(5.999, 0, type)).toEqual({ result: 'retired', cause: 'undersize' })
  })

  it('decides on the stored thousandths, so floating-point noise cannot tip the boundary', () => {
    // 6.35 − 0.35 is 5.999999999999999 in doubles; the database stores 6.000.
    expect(receiptVerdict(6.35 - 0.35, 0, type).result).toBe('reground')
    // 0.23622 in is 5.999988 mm: stored as 6.000, usable.
    expect(receiptVerdict(0.23622 * 25.4, 0, type).result).toBe('reground')
    expect(receiptVerdict(0.2362 * 25.4, 0, type).result).toBe('retired') // 5.99948 → 5.999
  })

  it('the last regrind the type allows is reground; one more is retired as worn', () => {
    expect(receiptVerdict(6.2, 1, type)).toEqual({ result: 'reground', cause: null })
    expect(receiptVerdict(6.2, 2, type)).toEqual({ result: 'retired', cause: 'regrinds_exceeded' })
    expect(receiptVerdict(6.2, 0, { ...type, maxRegrinds: 0 })).toEqual({ result: 'retired', cause: 'regrinds_exceeded' })
  })

  it('undersize wins when both rules fail: the measurement is what the shop sees', () => {
    expect(receiptVerdict(5.5, 2, type).cause).toBe('undersize')
  })

  it('refuses a diameter that is not positive', () => {
    expect(() => receiptVerdict(0, 0, type)).toThrow(RangeError)
    expect(() => receiptVerdict(Number.NaN, 0, type)).toThrow(RangeError)
  })

  it('says in plain words what will happen', () => {
    expect(receiptSentence({ result: 'reground', cause: null })).toMatch(/back in the crib/)
    expect(receiptSentence({ result: 'retired', cause: 'undersize' })).toMatch(/minimum usable diameter/)
    expect(receiptSentence({ result: 'retired', cause: 'regrinds_exceeded' })).toMatch(/More regrinds/)
  })
})

describe('the expected diameter after a regrind', () => {
  it('is the diameter less the type\'s regrind loss, to the thousandth', () => {
    expect(expectedDiameterMm(6.35, 0.15)).toBe(6.2)
    expect(expectedDiameterMm(9.525, 0.25)).toBe(9.275)
    expect(roundMm(6.0004)).toBe(6)
  })
})

describe('why a due cutter is retired rather than resharpened', () => {
  const due = { status: 'in_crib', lifeUsed: 1, flagged: null, regrindCount: 0, diameterMm: 6.35 } as const
  const rules = { maxRegrinds: 2, regrindDiameterLossMm: 0.2, minUsableDiameterMm: 6.0 }

  it('regrinds used up, in words', () => {
    const cause = retireCause({ ...due, regrindCount: 2 }, rules)
    expect(cause).toBe('regrinds_used_up')
    expect(retireSentence(cause!, 2)).toBe('Its regrinds are used up (2 of 2).')
    expect(retireSentence('regrinds_used_up', 0)).toBe('This type is not worth regrinding.')
  })

  it('diameter would fall below the minimum, in words', () => {
    const cause = retireCause({ ...due, diameterMm: 6.19 }, rules)
    expect(cause).toBe('too_small')
    expect(retireSentence(cause!, 2)).toMatch(/below the minimum usable diameter/)
    expect(retireCause({ ...due, diameterMm: 6.2 }, rules)).toBeNull() // 6.2 − 0.2 = 6.0, still usable
  })
})

describe('a reground cutter\'s new sharp life', () => {
  it('starts at nothing used, one regrind more, its life scaled by the shop\'s regrind fraction', () => {
    // The rule as the route and the demo history both apply it: life used back to 0, and a
    // reground bit's life taken as a fraction of a new one (0.8 here; common practice, 70-90 %).
    expect(afterRegrind(1, 6.2, 0.8)).toEqual({
      status: 'in_crib', diameterMm: 6.2, regrindCount: 2, lifeUsed: 0, lifeScale: 0.8, minutesThisLife: 0, flagged: null, flaggedAt: null,
    })
  })
})
