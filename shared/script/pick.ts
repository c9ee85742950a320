/**
 * Deterministic choice of a phrasing: the same steps always give the same script,
 * yet neighbouring lines don't sound alike.
 */

/** FNV-1a over a list of numbers: small, stable across runtimes, good enough to spread choices. */
export function hashNumbers(values: number[]): number {
  let h = 0x811c9dc5
  for (const v of values) {
    h ^= v & 0xffff
    h = Math.imul(h, 0x01000193) >>> 0
    h ^= v >>> 16
    h = Math.imul(h, 0x01000193) >>> 0
  }
  return h >>> 0
}

/** Hash of a string (titles, technique ids). */
export function hashString(s: string): number {
  const codes: number[] = []
  for (let i = 0; i < s.length; i++) codes.push(s.charCodeAt(i))
  return hashNumbers(codes)
}

/**
 * Order of phrasings to try for a line: a rotation starting at the hashed slot,
 * so the first acceptable one is the choice and a rejected one moves on predictably.
 */
export function rotation(count: number, seed: number): number[] {
  const start = seed % count
  return Array.from({ length: count }, (_, i) => (start + i) % count)
}

/** The first word of a sentence, lower-cased: two neighbouring lines must not share it. */
export function openerOf(text: string): string {
  const m = /^[^\p{L}\p{N}]*([\p{L}\p{N}']+)/u.exec(text)
  return m ? m[1].toLowerCase() : ''
}
