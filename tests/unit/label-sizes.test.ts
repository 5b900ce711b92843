// The label stock: each layout fits its page and keeps the QR code at 18 mm or more, and labels
// fill pages across then down. Sheet sizes: A4 is 210 × 297 mm (ISO 216); US Letter is
// 8.5" × 11" (ANSI/ASME Y14.1), at 25.4 mm per inch exactly (international yard and pound
// agreement, 1959).
import { describe, expect, it } from 'vitest'
import { LABEL_SIZES, LABEL_SIZE_KEYS, paginateLabels, slotPositionMm } from '../../shared/kerf/label-sizes'

const EPS = 1e-9

describe('label sizes', () => {
  it.each(LABEL_SIZE_KEYS)('%s: every label lies on the page, none overlaps the next, and the QR code fits', (key) => {
    const size = LABEL_SIZES[key]
    expect(size.qrMm).toBeGreaterThanOrEqual(18)
    expect(size.qrMm).toBeLessThan(Math.min(size.labelMm.width, size.labelMm.height))
    expect(size.pitchMm.x).toBeGreaterThanOrEqual(size.labelMm.width - EPS)
    expect(size.pitchMm.y).toBeGreaterThanOrEqual(size.labelMm.height - EPS)
    const last = slotPositionMm(size, size.columns * size.rows - 1)
    expect(last.left + size.labelMm.width).toBeLessThanOrEqual(size.pageMm.width + EPS)
    expect(last.top + size.labelMm.height).toBeLessThanOrEqual(size.pageMm.height + EPS)
  })

  it('the sheets are A4 and US Letter, and their labels are centred across', () => {
    expect(LABEL_SIZES['a4-24'].pageMm).toEqual({ width: 210, height: 297 })
    expect(LABEL_SIZES['letter-30'].pageMm.width).toBeCloseTo(215.9, 9)
    expect(LABEL_SIZES['letter-30'].pageMm.height).toBeCloseTo(279.4, 9)
    for (const key of ['a4-24', 'letter-30'] as const) {
      const size = LABEL_SIZES[key]
      const last = slotPositionMm(size, size.columns - 1)
      const right = size.pageMm.width - (last.left + size.labelMm.width)
      expect(right).toBeCloseTo(size.firstMm.left, 9)
    }
  })

  it('a roll label is its own page', () => {
    for (const key of ['roll-50x25', 'roll-25x25'] as const) {
      expect(LABEL_SIZES[key].pageMm).toEqual(LABEL_SIZES[key].labelMm)
    }
  })
})

describe('filling pages', () => {
  const sheet = LABEL_SIZES['a4-24']

  it('fills across then down', () => {
    expect(slotPositionMm(sheet, 0)).toEqual({ top: 0.5, left: 0 })
    expect(slotPositionMm(sheet, 2)).toEqual({ top: 0.5, left: 140 })
    expect(slotPositionMm(sheet, 3)).toEqual({ top: 37.5, left: 0 })
  })

  it('starts a new sheet after 24 labels', () => {
    const pages = paginateLabels(Array.from({ length: 25 }, (_, i) => i), sheet)
    expect(pages.map((p) => p.length)).toEqual([24, 1])
  })

  it('prints each label as many times as asked, side by side', () => {
    expect(paginateLabels(['a', 'b'], sheet, { copies: 2 })).toEqual([['a', 'a', 'b', 'b']])
  })

  it('leaves the used labels of a sheet empty, but never a whole sheet', () => {
    expect(paginateLabels(['a'], sheet, { skip: 3 })).toEqual([[null, null, null, 'a']])
    expect(paginateLabels(['a'], sheet, { skip: 99 })[0]).toHaveLength(24)
  })

  it('one roll label per page, and nothing at all for no labels', () => {
    expect(paginateLabels(['a', 'b'], LABEL_SIZES['roll-50x25'])).toEqual([['a'], ['b']])
    expect(paginateLabels([], sheet, { skip: 5 })).toEqual([])
  })
})
