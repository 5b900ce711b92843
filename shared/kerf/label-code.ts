// Label codes: short, random, and unambiguous when typed by hand. Pure.

/** No 0/O, 1/I/L: the characters people misread on a worn label. */
export const LABEL_ALPHABET = '23456789ABCDEFGHJKMNPQRSTUVWXYZ'
export const LABEL_LENGTH = 7

/** A new random code from the platform's cryptographic generator (rejection sampling keeps it uniform). */
export function newLabelCode(length = LABEL_LENGTH): string {
  const n = LABEL_ALPHABET.length
  const limit = 256 - (256 % n)
  let code = ''
  while (code.length < length) {
    const bytes = crypto.getRandomValues(new Uint8Array(length * 2))
    for (const b of bytes) {
      if (b < limit && code.length < length) code += LABEL_ALPHABET[b % n]
    }
  }
  return code
}

/** Tidies a typed code: upper case, without the spaces and dashes people add. */
export function normalizeLabelCode(typed: string): string {
  return typed.toUpperCase().replace(/[\s-]/g, '')
}

export function isLabelCode(code: string): boolean {
  return new RegExp(`^[${LABEL_ALPHABET}]{4,12}$`).test(code)
}

/** The label code in what a camera read off a label: the URL of a cutter page (…/c/CODE) or a
 *  bare code. Null for anything else, so a stray QR code never leads off to another site. */
export function labelCodeFromScan(text: string): string | null {
  const trimmed = text.trim()
  const fromUrl = /\/c\/([^/?#\s]+)\/?(?:[?#]\S*)?$/i.exec(trimmed)
  let candidate = trimmed
  if (fromUrl) {
    try {
      candidate = decodeURIComponent(fromUrl[1]!)
    } catch {
      return null // a malformed escape is not one of our labels
    }
  }
  const code = normalizeLabelCode(candidate)
  return isLabelCode(code) ? code : null
}
