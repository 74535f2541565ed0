/** Longest side a photo keeps on the phone and on the server, in pixels. */
export const photoLongSide = 1600
/** JPEG quality of a shrunk photo (0–1): grain and label text stay legible at a fifth of the bytes. */
export const photoQuality = 0.85

/**
 * The size a picture is drawn at so that its longer side is at most `maxSide`, keeping its shape;
 * a smaller picture keeps its size (it is never enlarged).
 * @param width - pixels across
 * @param height - pixels down
 */
export function fitWithin(width: number, height: number, maxSide = photoLongSide): { width: number, height: number } {
  if (!(width > 0 && height > 0))
    throw new RangeError('A picture needs a width and a height above zero.')
  const scale = Math.min(1, maxSide / Math.max(width, height))
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) }
}
