// A cutter shown from the phone's copy has the figures its page has: remaining minutes by linear
// damage accumulation (Miner's rule: remaining = (1 - D) x rated life x life scale / wear factor,
// as in any fatigue handbook), the due notice, and an age said in words.
import { describe, expect, it } from 'vitest'
import { cutterFromCopy, type OfflineCopy } from '../../shared/kerf/offline-copy'

const copy: OfflineCopy = {
  takenAt: '2026-12-03T08:00:00.000Z',
  user: { id: 5, shopId: 2, name: 'Op', role: 'operator' },
  shop: { lifeThreshold: 0.9, shiftMinutes: 720, timeZone: 'UTC' },
  types: [{
    id: 11, name: 'O-flute 1/8"', ratedLifeMinutes: 600, flutes: 1, cuttingDiameterMm: 3.175, shankDiameterMm: 6.35, helix: 'upcut',
    profile: 'o_flute', vAngleDeg: null, toolMaterial: 'solid_carbide', maxRegrinds: 2, regrindDiameterLossMm: 0.2, minUsableDiameterMm: 3,
  }],
  cutters: [
    [1, 'K7Q2M9P', 11, 'in_spindle', 4, 1, 3.175, 0.25, 0.8, 500, 120, null],
    [2, 'H3N8X2R', 11, 'in_crib', null, 2, 3.0, 0.95, 0.8, 1400, 456, null],
  ],
  materials: [
    { id: 1, name: 'MDF', family: 'sheet_goods', wearFactor: 1, common: true },
    { id: 2, name: 'Cast acrylic', family: 'hard_plastic', wearFactor: 1.5, common: true },
  ],
  machines: [{ id: 4, name: 'Big router', pockets: 8, loaded: [{ id: 1, code: 'K7Q2M9P', pocket: 1 }] }],
}

describe('a cutter from the copy', () => {
  it('has its remaining minutes in each material by Miner\'s rule', () => {
    const c = cutterFromCopy(copy, 'K7Q2M9P')!
    // (1 - 0.25) x 600 x 0.8 / 1 = 360; / 1.5 = 240.
    expect(c.remainingMinutes).toEqual([
      { materialId: 1, materialName: 'MDF', common: true, wearFactor: 1, minutes: 360 },
      { materialId: 2, materialName: 'Cast acrylic', common: true, wearFactor: 1.5, minutes: 240 },
    ])
    expect(c.machine).toEqual({ id: 4, name: 'Big router' })
    expect(c.due).toBeNull()
  })

  it('is due when its life used passes the shop\'s threshold, and retired when no regrind is left', () => {
    const c = cutterFromCopy(copy, 'H3N8X2R')!
    expect(c.due).toEqual({ reason: 'life_used', action: 'retire' })
    expect(c.remainingMinutes[0]!.minutes).toBe(24) // (1 - 0.95) x 600 x 0.8
  })

  it('is found by a code typed in lower case, and a code not in the copy finds nothing', () => {
    expect(cutterFromCopy(copy, 'k7q2m9p')?.id).toBe(1)
    expect(cutterFromCopy(copy, 'ZZZ9999')).toBeNull()
  })
})
