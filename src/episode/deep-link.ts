/**
 * The page's own deep links: `?t=` starts playback at a time, `#step-n` opens the step list at an item.
 * Both come from addresses people type and share, so anything unreadable is ignored rather than refused.
 */

const UNIT_MS: Record<string, number> = { h: 3_600_000, m: 60_000, s: 1000 }

/** `?t=` as milliseconds: plain seconds ("90"), units ("1m30s", "1h2m", "45s") or a clock ("1:30", "1:02:03"); null when unreadable. */
export function parseStartTime(raw: string | null): number | null {
  const value = raw?.trim().toLowerCase() ?? ''
  if (/^\d+(\.\d+)?$/.test(value)) return Math.round(Number(value) * 1000)
  if (/^(\d+h)?(\d+m)?(\d+(\.\d+)?s)?$/.test(value) && value !== '') {
    let ms = 0
    for (const [, amount, unit] of value.matchAll(/(\d+(?:\.\d+)?)([hms])/g)) ms += Number(amount) * UNIT_MS[unit]!
    return Math.round(ms)
  }
  const clock = /^(?:(\d+):)?(\d{1,2}):(\d{2})$/.exec(value)
  if (clock && Number(clock[3]) < 60 && (clock[1] === undefined || Number(clock[2]) < 60)) {
    return (Number(clock[1] ?? 0) * 3600 + Number(clock[2]) * 60 + Number(clock[3])) * 1000
  }
  return null
}

/** `#step-12` as the item's number (counted from 1), or null for any other fragment. */
export function parseStepHash(hash: string): number | null {
  const m = /^#step-([1-9]\d{0,4})$/.exec(hash)
  return m ? Number(m[1]) : null
}

/** The fragment that links to an item of the step list. */
export const stepAnchor = (n: number): string => `step-${n}`
