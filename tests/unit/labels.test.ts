// What a label says: the cutter page URL in its QR code, and the cutter type in short with the
// diameter in both units when it is a common inch size.
// 25.4 mm per inch exactly (international yard and pound agreement, 1959): 1/4" = 6.35 mm,
// 1/8" = 3.175 mm, 1/2" = 12.7 mm, 3/8" = 9.525 mm, 1/16" = 1.5875 mm.
import { describe, expect, it } from 'vitest'
import { cutterPageUrl, diameterText, inchFraction, typeShort } from '../../shared/kerf/labels'

describe('the cutter page URL', () => {
  it('is the base URL, /c/ and the label code, whatever slash the base ends with', () => {
    expect(cutterPageUrl('https://kerf.example.com', 'ABC2345')).toBe('https://kerf.example.com/c/ABC2345')
    expect(cutterPageUrl('https://kerf.example.com/', 'ABC2345')).toBe('https://kerf.example.com/c/ABC2345')
    expect(cutterPageUrl('https://example.com/kerfbook//', 'ABC2345')).toBe('https://example.com/kerfbook/c/ABC2345')
  })
})

describe('diameters as fractions of an inch', () => {
  it('names the common inch sizes exactly', () => {
    expect(inchFraction(6.35)).toBe('1/4"')
    expect(inchFraction(3.175)).toBe('1/8"')
    expect(inchFraction(12.7)).toBe('1/2"')
    expect(inchFraction(9.525)).toBe('3/8"')
    expect(inchFraction(1.5875)).toBe('1/16"')
    expect(inchFraction(0.79375)).toBe('1/32"')
    expect(inchFraction(2.38125)).toBe('3/32"')
    expect(inchFraction(7.9375)).toBe('5/16"')
    expect(inchFraction(19.05)).toBe('3/4"')
    expect(inchFraction(25.4)).toBe('1"')
    expect(inchFraction(31.75)).toBe('1-1/4"')
    expect(inchFraction(50.8)).toBe('2"')
  })

  it('accepts a catalogue figure within 0.01 mm of the inch size, and no further', () => {
    expect(inchFraction(6.34)).toBe('1/4"')
    expect(inchFraction(6.36)).toBe('1/4"')
    expect(inchFraction(6.339)).toBeNull()
    expect(inchFraction(3.18)).toBe('1/8"') // 3.175 rounded to two places
  })

  it('leaves metric sizes metric, including those close to an odd fraction', () => {
    for (const mm of [1, 2, 3, 4, 5, 6, 8, 10, 12, 13.5, 16, 20, 25, 50]) expect(inchFraction(mm), `${mm} mm`).toBeNull()
  })

  it('shows both units for inch sizes, millimetres first unless the person prefers inches', () => {
    expect(diameterText(6.35)).toBe('6.35 mm · 1/4"')
    expect(diameterText(3.175)).toBe('3.175 mm · 1/8"')
    expect(diameterText(12.7, 'in')).toBe('1/2" · 12.7 mm')
    expect(diameterText(8)).toBe('8 mm')
    expect(diameterText(8, 'in')).toBe('8 mm')
    expect(diameterText(6.0001)).toBe('6 mm')
  })
})

describe('the cutter type in short', () => {
  const upcut = { cuttingDiameterMm: 6.35, profile: 'square_end', vAngleDeg: null, flutes: 2, helix: 'upcut' } as const

  it('gives diameter, profile, flutes and helix', () => {
    expect(typeShort(upcut)).toBe('6.35 mm · 1/4" · square end · 2F · upcut')
    expect(typeShort({ ...upcut, cuttingDiameterMm: 3.175, profile: 'o_flute', flutes: 1 })).toBe('3.175 mm · 1/8" · O-flute · 1F · upcut')
    expect(typeShort({ ...upcut, cuttingDiameterMm: 8, helix: 'compression' })).toBe('8 mm · square end · 2F · compression')
    expect(typeShort({ ...upcut, profile: 'ball_nose', helix: 'downcut' })).toBe('6.35 mm · 1/4" · ball nose · 2F · downcut')
  })

  it('names a V-bit by its included angle', () => {
    expect(typeShort({ cuttingDiameterMm: 12.7, profile: 'v_bit', vAngleDeg: 60, flutes: 2, helix: 'straight' }))
      .toBe('12.7 mm · 1/2" · V 60° · 2F · straight')
    expect(typeShort({ cuttingDiameterMm: 12.7, profile: 'v_bit', vAngleDeg: 22.5, flutes: 2, helix: 'straight' }, 'in'))
      .toBe('1/2" · 12.7 mm · V 22.5° · 2F · straight')
  })
})
