import jsQR from 'jsqr'

const dark = { ' ': [false, false], '▀': [true, false], '▄': [false, true], '█': [true, true] } as const

/**
 * Reads back a QR code the `qrcode` package drew for a terminal (small mode: each character is two
 * modules, upper and lower half, black on a white background), with jsQR. Lines drawn in white on
 * white are the bottom margin and are left out. Returns the text, or null when none is found.
 */
export function readTerminalQr(output: string): string | null {
  const rows: boolean[][] = []
  for (const line of output.split('\n')) {
    if (!line.includes('\x1B[47m') || line.includes('\x1B[37m'))
      continue
    // eslint-disable-next-line no-control-regex -- as above
    const cells = [...line.replace(/\x1B\[[0-9;]*m/g, '')].map(char => dark[char as keyof typeof dark] ?? [false, false])
    rows.push(cells.map(cell => cell[0]), cells.map(cell => cell[1]))
  }
  if (rows.length === 0)
    return null
  const scale = 4
  const margin = 4
  const width = (rows[0]!.length + 2 * margin) * scale
  const height = (rows.length + 2 * margin) * scale
  const pixels = new Uint8ClampedArray(width * height * 4).fill(255)
  rows.forEach((row, y) => row.forEach((isDark, x) => {
    if (!isDark)
      return
    for (let dy = 0; dy < scale; dy++) {
      for (let dx = 0; dx < scale; dx++) {
        const at = (((y + margin) * scale + dy) * width + (x + margin) * scale + dx) * 4
        pixels.fill(0, at, at + 3)
      }
    }
  }))
  return jsQR(pixels, width, height)?.data ?? null
}
