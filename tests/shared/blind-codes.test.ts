import { describe, expect, it } from 'vitest'
import { blindCodeAlphabet, blindCodeLength, isBlindCode, newBlindCode, newBlindCodes, normalizeCode } from '../../shared/records/blind-codes'

/** Bytes from a fixed list, over and over: a random source a test can steer. */
function scripted(values: number[]) {
  let i = 0
  return (bytes: Uint8Array): Uint8Array => bytes.map(() => values[i++ % values.length]!)
}

describe('blindCodeAlphabet', () => {
  it('holds none of the characters read one for another', () => {
    for (const confusing of '0O1IL2Z5S8BQGD6U')
      expect(blindCodeAlphabet).not.toContain(confusing)
    expect(new Set(blindCodeAlphabet).size).toBe(blindCodeAlphabet.length)
  })
})

describe('newBlindCode', () => {
  it('makes a short code of the alphabet with the Web Crypto source', () => {
    const code = newBlindCode([])
    expect(code).toHaveLength(blindCodeLength)
    expect(isBlindCode(code)).toBe(true)
  })

  it('draws each character uniformly: bytes past the last whole multiple are drawn again', () => {
    // 252 = 14 × 18 is the first byte left out; 0 → C, 17 → 9, 18 → C again, 251 → 251 mod 18 = 17 → 9.
    expect(newBlindCode([], scripted([252, 255, 0, 17, 18, 251]))).toBe('C9C9')
  })

  it('never gives a code the event already uses, whatever its case', () => {
    expect(newBlindCode(['cfhj'], scripted([0, 1, 2, 3, 4, 5, 6, 7]))).toBe('KMNP')
  })

  it('is not sequential: a thousand codes are all different and spread over the alphabet', () => {
    const codes = newBlindCodes(1000, [])
    expect(new Set(codes).size).toBe(1000)
    const firsts = new Set(codes.map(code => code[0]))
    expect(firsts.size).toBe(blindCodeAlphabet.length)
  })
})

describe('normalizeCode', () => {
  it('reads a code as typed on a label: lower case, spaces and dashes', () => {
    expect(normalizeCode(' kx-4m ')).toBe('KX4M')
    expect(isBlindCode('kx-4m')).toBe(true)
    // A is a vowel, left out of the alphabet.
    expect(isBlindCode('kx-4a')).toBe(false)
  })
})
