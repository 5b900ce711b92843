// When a cutter is due, and whether it is resharpened or retired (docs/domain.md, computation 2).
import { describe, expect, it } from 'vitest'
import { dueAction, dueReason } from '../../shared/kerf/due'

const cutter = { status: 'in_crib', lifeUsed: 0.5, flagged: null, regrindCount: 0, diameterMm: 6.35 } as const
const type = { maxRegrinds: 2, regrindDiameterLossMm: 0.2, minUsableDiameterMm: 5.9 }

describe('due reason', () => {
  it('is due at the threshold, not below it', () => {
    expect(dueReason({ ...cutter, lifeUsed: 0.8999 }, 0.9)).toBeNull()
    expect(dueReason({ ...cutter, lifeUsed: 0.9 }, 0.9)).toBe('life_used')
  })

  it('a dull flag makes it due whatever its life used', () => {
    expect(dueReason({ ...cutter, lifeUsed: 0.1, flagged: 'dull' }, 0.9)).toBe('flagged_dull')
  })

  it('only cutters in the crib or a spindle can be due', () => {
    for (const status of ['at_regrind', 'retired', 'lost']) {
      expect(dueReason({ ...cutter, status, lifeUsed: 2 }, 0.9)).toBeNull()
    }
    expect(dueReason({ ...cutter, status: 'in_spindle', lifeUsed: 1 }, 0.9)).toBe('life_used')
  })
})

describe('resharpen or retire', () => {
  it('resharpens while regrinds are left and the diameter stays usable', () => {
    expect(dueAction({ ...cutter, regrindCount: 1 }, type)).toBe('resharpen')
  })

  it('retires when the regrinds are used up', () => {
    expect(dueAction({ ...cutter, regrindCount: 2 }, type)).toBe('retire')
  })

  it('retires when one more regrind would go below the minimum usable diameter, at the boundary', () => {
    expect(dueAction({ ...cutter, diameterMm: 6.1 }, type)).toBe('resharpen') // 6.1 − 0.2 = 5.9, still usable
    expect(dueAction({ ...cutter, diameterMm: 6.09 }, type)).toBe('retire') // 5.89 < 5.9
  })

  it('a type that cannot be reground is always retired', () => {
    expect(dueAction(cutter, { ...type, maxRegrinds: 0 })).toBe('retire')
  })
})
