import { readFileSync } from 'node:fs'

/** Rows of a fixture CSV with `#` comment lines and a header row. */
export function readCsv(name: string): Record<string, number>[] {
  const lines = readFileSync(new URL(`../fixtures/${name}`, import.meta.url), 'utf8').split('\n').map(line => line.trim()).filter(line => line && !line.startsWith('#'))
  const [header, ...rows] = lines
  const keys = header!.split(',')
  return rows.map(row => Object.fromEntries(row.split(',').map((cell, i) => [keys[i]!, Number(cell)])))
}

/** The certified values written in a fixture's comment header, e.g. `B1 (slope) = 1.002…`. */
export function readHeader(name: string): string {
  return readFileSync(new URL(`../fixtures/${name}`, import.meta.url), 'utf8').split('\n').filter(line => line.startsWith('#')).join('\n')
}

/** Significant digits on which two numbers agree: NIST's log relative error, −log10(|a − b| / |b|). */
export function agreeingDigits(actual: number, certified: number): number {
  if (actual === certified)
    return 16
  return -Math.log10(Math.abs(actual - certified) / Math.abs(certified))
}
