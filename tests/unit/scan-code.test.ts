// What the scanner accepts: the URL a label's QR code holds, or a bare code; nothing else.
import { describe, expect, it } from 'vitest'
import { labelCodeFromScan } from '../../shared/kerf/label-code'

describe('reading a label code off a scan', () => {
  it('takes the code from a cutter page URL, whatever the host', () => {
    expect(labelCodeFromScan('https://kerfbook.example.com/c/K7Q2M9P')).toBe('K7Q2M9P')
    expect(labelCodeFromScan('http://192.168.1.20:3000/c/k7q2m9p/')).toBe('K7Q2M9P')
    expect(labelCodeFromScan('https://kerfbook.example.com/c/K7Q2M9P?from=label#top')).toBe('K7Q2M9P')
  })

  it('takes a bare code, tidied the way a typed one is', () => {
    expect(labelCodeFromScan(' k7q-2m9p ')).toBe('K7Q2M9P')
  })

  it('refuses other QR codes and codes with look-alike characters', () => {
    expect(labelCodeFromScan('https://example.com/menu')).toBeNull()
    expect(labelCodeFromScan('https://example.com/c/')).toBeNull()
    expect(labelCodeFromScan('https://example.com/c/K0Q1M9P')).toBeNull()
    expect(labelCodeFromScan('https://example.com/c/%E0%A4%A')).toBeNull()
    expect(labelCodeFromScan('WIFI:S:shop;T:WPA;P:secret;;')).toBeNull()
    expect(labelCodeFromScan('')).toBeNull()
  })
})
