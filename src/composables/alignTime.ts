/** A time in the recording to a tenth of a second, "1:02.3" (or "1:02:03.4" past an hour): the nudge step is 0.1 s. */
export function formatTenths(ms: number): string {
  const tenths = Math.round(Math.max(0, ms) / 100)
  const s = Math.floor(tenths / 10)
  const h = Math.floor(s / 3600)
  const m = Math.floor((s % 3600) / 60)
  const sec = `${String(s % 60).padStart(2, '0')}.${tenths % 10}`
  return h > 0 ? `${h}:${String(m).padStart(2, '0')}:${sec}` : `${m}:${sec}`
}

/** A byte count for people: "12.4 MB". */
export function formatBytes(bytes: number): string {
  if (bytes < 1000) return `${bytes} B`
  const units = ['kB', 'MB', 'GB', 'TB']
  let value = bytes / 1000
  let unit = 0
  while (value >= 1000 && unit < units.length - 1) {
    value /= 1000
    unit++
  }
  return `${value.toFixed(value < 10 ? 2 : 1)} ${units[unit]}`
}
