import type { Page } from 'playwright-core'

/**
 * A picture drawn on a canvas in the page, as a camera would hand it over: `width` × `height`
 * pixels of stripes (green beans do not matter here, only size and type).
 */
export async function drawnPicture(page: Page, width: number, height: number, type: 'image/jpeg' | 'image/png'): Promise<Buffer> {
  const base64 = await page.evaluate(({ width, height, type }) => {
    const canvas = document.createElement('canvas')
    canvas.width = width
    canvas.height = height
    const context = canvas.getContext('2d')!
    for (let x = 0; x < width; x += 40) {
      context.fillStyle = (x / 40) % 2 ? '#6b7d4a' : '#c8c2a8'
      context.fillRect(x, 0, 40, height)
    }
    return canvas.toDataURL(type, 0.9).split(',')[1]!
  }, { width, height, type })
  return Buffer.from(base64, 'base64')
}

/**
 * Width and height of a JPEG from its start-of-frame segment (ITU-T T.81, B.2.2: SOF0–SOF15 but
 * DHT, JPG and DAC carry the frame size after the sample precision byte).
 */
export function jpegSize(bytes: Buffer): { width: number, height: number } | null {
  if (bytes[0] !== 0xFF || bytes[1] !== 0xD8)
    return null
  let at = 2
  while (at + 9 < bytes.length) {
    if (bytes[at] !== 0xFF)
      return null
    const marker = bytes[at + 1]!
    const length = bytes.readUInt16BE(at + 2)
    if (marker >= 0xC0 && marker <= 0xCF && marker !== 0xC4 && marker !== 0xC8 && marker !== 0xCC)
      return { height: bytes.readUInt16BE(at + 5), width: bytes.readUInt16BE(at + 7) }
    at += 2 + length
  }
  return null
}
