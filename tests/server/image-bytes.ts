import { crc32, deflateSync } from 'node:zlib'

// Small real pictures for the upload tests. The JPEG and WebP are 4 × 3 pixels drawn once on a
// canvas in Chromium (colour profile taken out); the PNG is built here, chunk by chunk (PNG spec,
// W3C Recommendation 2003: signature, IHDR, IDAT of zlib-deflated scanlines, IEND, each with its CRC-32).

const jpeg = '/9j/4AAQSkZJRgABAQAAAQABAAD/2wBDAAYEBQYFBAYGBQYHBwYIChAKCgkJChQODwwQFxQYGBcUFhYaHSUfGhsjHBYWICwgIyYnKSopGR8tMC0oMCUoKSj/2wBDAQcHBwoIChMKChMoGhYaKCgoKCgoKCgoKCgoKCgoKCgoKCgoKCgoKCgoKCgoKCgoKCgoKCgoKCgoKCgoKCgoKCj/wAARCAADAAQDASIAAhEBAxEB/8QAFQABAQAAAAAAAAAAAAAAAAAAAAb/xAAaEAEAAQUAAAAAAAAAAAAAAAAAAQMFNYKy/8QAFQEBAQAAAAAAAAAAAAAAAAAAAwX/xAAcEQABAwUAAAAAAAAAAAAAAAAAAQMEMjRxcrH/2gAMAwEAAhEDEQA/AJ2+ZStrzACM1QmAZlw5svT/2Q=='
const webp = 'UklGRkgAAABXRUJQVlA4IDwAAAAwAgCdASoEAAMAAUAmJZACdEcAZIACzay6iAD+rcjxyJJ/zxXG7h/q4VZ3r+pgX/Bv24v8Zkv+DaTAAAA='

export const jpegBytes = (): Buffer => Buffer.from(jpeg, 'base64')
export const webpBytes = (): Buffer => Buffer.from(webp, 'base64')

function chunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4)
  length.writeUInt32BE(data.length)
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data])
  const crc = Buffer.alloc(4)
  crc.writeUInt32BE(crc32(body))
  return Buffer.concat([length, body, crc])
}

/** A 4 × 3 green PNG (8-bit RGB). */
export function pngBytes(width = 4, height = 3): Buffer {
  const header = Buffer.alloc(13)
  header.writeUInt32BE(width, 0)
  header.writeUInt32BE(height, 4)
  header.set([8, 2, 0, 0, 0], 8)
  const row = Buffer.concat([Buffer.from([0]), Buffer.from(Array.from({ length: width }, () => [0x4A, 0x6B, 0x3A]).flat())])
  const pixels = Buffer.concat(Array.from({ length: height }, () => row))
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A]), chunk('IHDR', header), chunk('IDAT', deflateSync(pixels)), chunk('IEND', Buffer.alloc(0))])
}
