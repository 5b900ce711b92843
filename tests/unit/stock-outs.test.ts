// Stock-out days rebuilt from cutters' changes of state, worked by hand on small histories.
import { describe, expect, it } from 'vitest'
import { daysWithoutSharp, sharpDelta, stockOutDays, utcDay } from '../../shared/kerf/stock-outs'
import { chanceWords, reorderSentence, usageWords } from '../../shared/kerf/reorder-words'

const at = (day: number, hour = 12) => new Date(Date.UTC(2026, 0, 1 + day, hour))
const d = (day: number) => utcDay(at(day))

describe('days without a sharp cutter', () => {
  it('counts a cutter in the crib or a spindle as sharp stock, and nothing else', () => {
    expect(sharpDelta({ from: null, to: 'in_crib' })).toBe(1)
    expect(sharpDelta({ from: 'in_crib', to: 'in_spindle' })).toBe(0)
    expect(sharpDelta({ from: 'in_spindle', to: 'at_regrind' })).toBe(-1)
    expect(sharpDelta({ from: 'at_regrind', to: 'retired' })).toBe(0)
    expect(sharpDelta({ from: 'lost', to: 'in_crib' })).toBe(1)
  })

  it('a day is empty when the count touched zero at any moment of it', () => {
    // One cutter: received day 0, sent out day 3 at noon, back day 6 at 9:00.
    const changes = [
      { at: at(0), from: null, to: 'in_crib' },
      { at: at(3), from: 'in_crib', to: 'at_regrind' },
      { at: at(6, 9), from: 'at_regrind', to: 'in_crib' },
    ]
    expect([...daysWithoutSharp(changes, d(1), d(8))]).toEqual([d(3), d(4), d(5), d(6)])
    // Before the first cutter arrived at noon on day 0 there was none.
    expect([...daysWithoutSharp(changes, d(-2), d(0))]).toEqual([d(-2), d(-1), d(0)])
  })

  it('only days on which its materials were cut are stock-outs', () => {
    const changes = [{ at: at(0), from: null, to: 'in_crib' }, { at: at(3), from: 'in_crib', to: 'lost' }]
    expect(stockOutDays(changes, new Set([d(1), d(4), d(9), d(20)]), d(0), d(10))).toBe(2)
  })
})

describe('plain words', () => {
  it('says how often a type is used and the chance of running out as a person would', () => {
    expect(usageWords(1 / 9)).toBe('You use about one every 9 days')
    expect(usageWords(3)).toBe('You use about 3 a day')
    expect(usageWords(0)).toBe('Nobody has used one in the last 90 days')
    expect(chanceWords(0.2)).toBe('a 1-in-5 chance')
    expect(chanceWords(0.004)).toBe('less than a 1-in-100 chance')
  })

  it('reads like the crib manager\'s own note', () => {
    const sentence = reorderSentence({
      dailyDemand: 1 / 9, sdDailyDemand: 0.3, z: 1.64, leadTimeDemand: 12 / 9, safetyStock: 0, reorderPoint: 3, orderUpTo: 6,
      economicOrderQuantity: 1.1, method: 'poisson', keepAtLeast: null, atRegrind: 1, position: 3, belowReorderPoint: true,
      suggestedQty: 4, riskWithoutOrder: 0.2, livesPerCutter: 2.6, leadTimeDays: 12, reviewDays: 7, serviceLevel: 0.95, packSize: 2,
      available: 2, onOrder: 0, maxOnHand: null, sparesPerMachine: null, machinesUsing: 1, doNotReorder: false,
    })
    expect(sentence).toBe('Order 4 (2 packs). You use about one every 9 days; delivery takes 12 days; 2 in the crib and spindles, '
      + '1 coming back from the regrinder. Without this order there is a 1-in-5 chance of running out before it arrives.')
  })
})
