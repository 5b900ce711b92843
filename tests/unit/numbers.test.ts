// Lengths, percentages and service levels as people type them.
import { describe, expect, it } from 'vitest'
import { lengthText, parseDecimal, parseLength, parsePercent, parseServiceLevel, roundTo } from '../../shared/kerf/numbers'

describe('lengths typed in the person\'s unit, in millimetres', () => {
  // 25.4 mm per inch exactly (international yard and pound agreement, 1959).
  it.each([
    ['0.25', 6.35], ['1/4', 6.35], ['1/4"', 6.35], ['1 1/4', 31.75], ['1-1/2 in', 38.1], ['3/8', 9.525], ['1/8', 3.175], ['.5', 12.7], ['3/16', 4.763], ['5/32', 3.969],
  ])('%s in is %f mm', (text, mm) => {
    expect(parseLength(text, 'in')).toBe(mm)
  })

  it('reads millimetres, to the database\'s 0.001 mm', () => {
    expect(parseLength('6.35', 'mm')).toBe(6.35)
    expect(parseLength('6.35 mm', 'mm')).toBe(6.35)
    expect(parseLength('6.12345', 'mm')).toBe(6.123)
    // Half up in decimal, not in binary: 4.7625 * 1000 is 4762.4999... as a double.
    expect(parseLength('4.7625', 'mm')).toBe(4.763)
    expect(roundTo(1e-7, 3)).toBe(0)
  })

  it.each(['', 'abc', '1/0', '1/4', '6,35'])('refuses "%s" in mm', (text) => {
    expect(parseLength(text, 'mm')).toBeUndefined()
  })

  it('shows a stored length for typing, and reads it back unchanged', () => {
    expect(lengthText(6.35, 'in')).toBe('0.25')
    expect(lengthText(3.175, 'in')).toBe('0.125')
    expect(lengthText(6.35, 'mm')).toBe('6.35')
    expect(lengthText(null, 'mm')).toBe('')
    for (const mm of [3.175, 6.35, 9.525, 12.7, 19.05, 25.4]) expect(parseLength(lengthText(mm, 'in'), 'in')).toBe(mm)
  })
})

describe('percentages and service levels', () => {
  it('reads a percentage as a fraction', () => {
    expect(parsePercent('45')).toBe(0.45)
    expect(parsePercent('45 %')).toBe(0.45)
    expect(parsePercent('120%')).toBe(1.2)
    expect(parsePercent('x')).toBeUndefined()
  })

  it('takes a service level as a percentage or a fraction', () => {
    expect(parseServiceLevel('95')).toBe(0.95)
    expect(parseServiceLevel('0.95')).toBe(0.95)
    expect(parseServiceLevel('99.5')).toBe(0.995)
    expect(parseServiceLevel('97.5 %')).toBe(0.975)
    expect(parseServiceLevel('ninety')).toBeUndefined()
  })

  it('reads plain decimals only', () => {
    expect(parseDecimal(' 12.5 ')).toBe(12.5)
    expect(parseDecimal('-3')).toBe(-3)
    expect(parseDecimal('1e3')).toBeUndefined()
    expect(parseDecimal('')).toBeUndefined()
  })
})
