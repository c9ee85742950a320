/**
 * Time codes as each format writes them.
 */

/** "m:ss", or "h:mm:ss" from an hour on: the way chapter lines in a description read (common practice). */
export function formatClock(ms: number): string {
  const total = Math.floor(Math.max(0, ms) / 1000)
  const h = Math.floor(total / 3600)
  const m = Math.floor((total % 3600) / 60)
  const s = total % 60
  return h > 0 ? `${h}:${pad(m, 2)}:${pad(s, 2)}` : `${m}:${pad(s, 2)}`
}

/** "hh:mm:ss.ttt" (W3C WebVTT timestamp, hours always written). */
export function vttTimestamp(ms: number): string {
  return stamp(ms, '.')
}

/** "hh:mm:ss,ttt" (SRT timestamp). */
export function srtTimestamp(ms: number): string {
  return stamp(ms, ',')
}

function stamp(ms: number, sep: string): string {
  const t = Math.max(0, Math.round(ms))
  const h = Math.floor(t / 3_600_000)
  const m = Math.floor((t % 3_600_000) / 60_000)
  const s = Math.floor((t % 60_000) / 1000)
  return `${pad(h, 2)}:${pad(m, 2)}:${pad(s, 2)}${sep}${pad(t % 1000, 3)}`
}

function pad(n: number, width: number): string {
  return String(n).padStart(width, '0')
}
