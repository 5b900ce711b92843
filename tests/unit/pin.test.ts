// The PIN rules shared by the devices page and the routes: 4 to 8 ASCII digits, and none of the
// PINs anyone tries first (one digit over and over, a straight run up or down). Which PINs people
// pick first is common practice knowledge of PIN guessing, from memory: 1234, 0000, 1111 and
// runs lead every list of the most used four-digit PINs.
import { describe, expect, it } from 'vitest'
import { isObviousPin, Pin, PinSignInBody } from '../../shared/schemas/devices'

describe('PINs', () => {
  it('calls one digit repeated and straight runs obvious, and nothing else', () => {
    for (const pin of ['0000', '1111', '99999999', '1234', '4321', '0123', '9876', '01234567', '87654321', '3456']) expect(isObviousPin(pin), pin).toBe(true)
    for (const pin of ['2580', '1357', '4827', '1212', '7890', '0987', '12345670', '1122', '9012']) expect(isObviousPin(pin), pin).toBe(false)
  })

  it('takes 4 to 8 digits, trimmed, and names what is wrong otherwise', () => {
    expect(Pin.parse(' 4827 ')).toBe('4827')
    expect(Pin.parse('48271593')).toBe('48271593')
    for (const [pin, why] of [['482', /4 to 8 digits/], ['482715930', /4 to 8 digits/], ['48a7', /4 to 8 digits/], ['\uFF14\uFF18\uFF12\uFF17', /4 to 8 digits/],
      ['-482', /4 to 8 digits/], ['1234', /straight run/], ['7777', /all the same/]] as const) {
      const res = Pin.safeParse(pin)
      expect(res.success, pin).toBe(false)
      expect(res.error!.issues[0]!.message, pin).toMatch(why)
    }
  })

  it('signing in checks only the shape, so an old obvious PIN gets a plain wrong-PIN answer from the server', () => {
    expect(PinSignInBody.parse({ userId: 7, pin: '1234' })).toEqual({ userId: 7, pin: '1234' })
    expect(PinSignInBody.safeParse({ userId: 7, pin: '123' }).success).toBe(false)
    expect(PinSignInBody.safeParse({ userId: '7', pin: '4827' }).success).toBe(false)
  })
})
