/** "just now", "2 minutes ago", "3 hours ago", or the date: how long ago an ISO time was, for "Priya saved 2 minutes ago". */
export function savedAgo(iso: string, now: number = Date.now()): string {
  const at = Date.parse(iso)
  if (Number.isNaN(at)) return 'a while ago'
  const seconds = Math.max(0, Math.round((now - at) / 1000))
  if (seconds < 45) return 'just now'
  const minutes = Math.round(seconds / 60)
  if (minutes < 60) return minutes === 1 ? '1 minute ago' : `${minutes} minutes ago`
  const hours = Math.round(minutes / 60)
  if (hours < 24) return hours === 1 ? '1 hour ago' : `${hours} hours ago`
  return `on ${new Date(at).toLocaleString()}`
}
