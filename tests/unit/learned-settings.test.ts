// The learned nudge reads the shop's own cut logs: only when melted or fuzzy cuts with settings
// are on record, and then the middle settings of the clean cuts of the same type and material.
import { describe, expect, it } from 'vitest'
import { learnedNudge, median, type LoggedSettings } from '../../shared/kerf/learned-settings'

const log = (outcome: LoggedSettings['outcome'], rpm: number | null, feedMmPerMin: number | null): LoggedSettings => ({ outcome, rpm, feedMmPerMin })

describe('median', () => {
  it('is the middle value, or the mean of the middle two', () => {
    expect(median([3, 1, 2])).toBe(2)
    expect(median([4, 1, 3, 2])).toBe(2.5)
    expect(() => median([])).toThrow(RangeError)
  })
})

describe('the learned nudge', () => {
  it('says nothing without a melted or fuzzy cut that recorded its settings', () => {
    expect(learnedNudge([log('clean', 18000, 3000), log('chip_out', 18000, 3000)], 1)).toBeNull()
    expect(learnedNudge([log('melted', null, 1500), log('fuzzy', 18000, null), log('clean', 18000, 3000)], 1)).toBeNull()
  })

  it('shows the clean cuts\' middle rpm, feed and chip load, and how many logs back it', () => {
    const nudge = learnedNudge([
      log('melted', 24000, 1200), log('fuzzy', 22000, 1000), log('melted', 24000, 1400),
      log('clean', 18000, 3000), log('clean', 16000, 2800), log('clean', 18000, 3600), log('clean', null, null), log('broken', 18000, 9000),
    ], 1)!
    expect(nudge.bad).toMatchObject({ count: 3, rpm: 24000, feedMmPerMin: 1200 })
    expect(nudge.clean).toMatchObject({ count: 3, rpm: 18000, feedMmPerMin: 3000 })
    expect(nudge.clean!.feedInPerMin).toBeCloseTo(3000 / 25.4, 1)
    // Chip loads per log: 3000/18000, 2800/16000, 3600/18000 → 0.1667, 0.175, 0.2; the middle is 0.175.
    expect(nudge.clean!.chipLoadMm).toBeCloseTo(0.175, 4)
    expect(nudge.bad.chipLoadMm).toBeLessThan(nudge.clean!.chipLoadMm)
  })

  it('still reports the bad cuts when no clean cut has settings yet', () => {
    expect(learnedNudge([log('melted', 24000, 1000), log('clean', null, 3000)], 2)).toMatchObject({ bad: { count: 1 }, clean: null })
  })

  it('divides the feed by the flutes for the chip load', () => {
    expect(learnedNudge([log('melted', 20000, 2000), log('clean', 20000, 4000)], 2)!.clean!.chipLoadMm).toBeCloseTo(0.1, 9)
  })
})
