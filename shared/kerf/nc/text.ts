// Turns an uploaded file's bytes into program text, or refuses it with a sentence: an NC program
// is plain text, so an empty file or one with binary bytes is not one. Pure.
import { NcRefusal } from './read'

/** Bytes allowed in a program besides printable text: tab, line feed, form feed, carriage return. */
const CONTROL_OK = new Set([0x09, 0x0A, 0x0C, 0x0D])

export function programText(bytes: Uint8Array): string {
  if (bytes.length === 0 || bytes.every((b) => b === 0x20 || CONTROL_OK.has(b))) {
    throw new NcRefusal('The file is empty: choose the NC program (.nc, .ngc, .tap) the CAM software wrote.', { kind: 'empty' })
  }
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i]!
    if ((b < 0x20 && !CONTROL_OK.has(b)) || b === 0x7F) {
      throw new NcRefusal(`This is not an NC program: it holds binary data (byte ${i + 1} is 0x${b.toString(16).padStart(2, '0')}). Choose the G-code text file the CAM software wrote.`, { kind: 'binary' })
    }
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes)
  } catch {
    // Older posts write Latin-1 comments (a degree sign, an accented name): still text.
    return new TextDecoder('latin1').decode(bytes)
  }
}
