// Money typed in dollars becomes whole cents exactly, and cents print back as the same text.
import { describe, expect, it } from 'vitest'
import { formatMoney, parseMoney, showMoney } from '../../shared/kerf/money'

describe('dollars to cents', () => {
  it.each([
    ['42.50', 4250], ['42.5', 4250], ['42', 4200], ['0.29', 29], ['.5', 50], ['$1,234.56', 123456], ['  $ 7.05 ', 705],
    ['0', 0], ['1000000', 100000000],
  ])('%s is %i cents', (text, cents) => {
    expect(parseMoney(text)).toBe(cents)
  })

  // 0.29 * 100 is 28.999999999999996 in floating point: the parser never multiplies a fraction.
  it('has no floating-point drift', () => {
    for (let cents = 0; cents < 1000; cents++) expect(parseMoney(formatMoney(cents))).toBe(cents)
  })

  it.each(['', '-3', '4.255', 'abc', '1,23', '12,345,6', '$', '.', '1.2.3', '3e2'])('refuses "%s"', (text) => {
    expect(parseMoney(text)).toBeUndefined()
  })
})

describe('cents to text', () => {
  it('always shows two decimals', () => {
    expect(formatMoney(4250)).toBe('42.50')
    expect(formatMoney(5)).toBe('0.05')
    expect(formatMoney(0)).toBe('0.00')
    expect(showMoney(null)).toBe('—')
  })

  it('shows the shop\'s currency with its symbol and thousands separators', () => {
    // ISO 4217: all five have a minor unit of 2; the symbols are CLDR's English ones (from memory).
    expect(showMoney(123456)).toBe('$1,234.56')
    expect(showMoney(123456, 'CAD')).toBe('CA$1,234.56')
    expect(showMoney(123456, 'AUD')).toBe('A$1,234.56')
    expect(showMoney(5, 'EUR')).toBe('€0.05')
    expect(showMoney(-250000, 'GBP')).toBe('-£2,500.00')
  })
})
