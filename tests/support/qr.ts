// Reads QR codes back for tests with jsQR, an independent decoder: from a PNG (decoded to RGBA
// by pngjs) or from the SVG that the qrcode package writes.
import jsQR from 'jsqr'
import { PNG } from 'pngjs'

export function decodeQrPng(png: Buffer): string | null {
  const image = PNG.sync.read(png)
  return jsQR(new Uint8ClampedArray(image.data), image.width, image.height)?.data ?? null
}

/**
 * Rasterises the one dark path of a qrcode SVG (`M x y`, `m dx 0`, `h n`: runs of dark modules
 * along a row, each row at y + 0.5) at `scale` pixels a module with a 4-module quiet zone, the
 * minimum ISO/IEC 18004 asks for, then decodes it.
 */
export function decodeQrSvg(svg: string, scale = 4): string | null {
  const size = Number(/viewBox="0 0 (\d+) \d+"/.exec(svg)?.[1])
  const d = /<path[^>]*stroke="[^"]*"[^>]*\sd="([^"]+)"/.exec(svg)?.[1]
  if (!size || !d) throw new Error('not a qrcode SVG')
  const dark = new Set<string>()
  let x = 0
  let y = 0
  for (const [, cmd, a, b] of d.matchAll(/([MmHh])\s*(-?[\d.]+)(?:\s+(-?[\d.]+))?/g)) {
    const n = Number(a)
    if (cmd === 'M') { x = n; y = Number(b) } else if (cmd === 'm') { x += n; y += Number(b ?? 0) } else if (cmd === 'h') {
      for (let i = 0; i < n; i++) dark.add(`${x + i},${Math.floor(y)}`)
      x += n
    } else {
      throw new Error(`unexpected path command ${cmd}`)
    }
  }
  const quiet = 4
  const side = (size + 2 * quiet) * scale
  const rgba = new Uint8ClampedArray(side * side * 4).fill(255)
  for (const cell of dark) {
    const [cx, cy] = cell.split(',').map(Number) as [number, number]
    for (let py = 0; py < scale; py++) {
      for (let px = 0; px < scale; px++) {
        const offset = (((cy + quiet) * scale + py) * side + (cx + quiet) * scale + px) * 4
        rgba[offset] = rgba[offset + 1] = rgba[offset + 2] = 0
      }
    }
  }
  return jsQR(rgba, side, side)?.data ?? null
}
