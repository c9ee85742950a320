/**
 * The channel's calendar sums: planned publish dates against a cadence of one episode every N days.
 * Days are 'YYYY-MM-DD' strings read in UTC, so a day is the same day for everyone on the team.
 *
 * - a clash: two takes planned closer together than the cadence (the same day included);
 * - a gap: the days an episode was due by the cadence but none is planned, between two planned dates;
 * - the next free slot: the first day from a given one that is at least a cadence away from every planned date,
 *   so planning a take there makes no clash (it fills a gap first when one is wide enough).
 */

const DAY_MS = 86_400_000

/** A day as a whole number (days since 1970-01-01), for sums. */
export function dayNumber(day: string): number {
  const [y, m, d] = day.split('-').map(Number)
  return Math.round(Date.UTC(y!, m! - 1, d!) / DAY_MS)
}

/** The 'YYYY-MM-DD' of a day number. */
function dayOf(n: number): string {
  return new Date(n * DAY_MS).toISOString().slice(0, 10)
}

/** The day `days` after `day` (before, when negative). */
export const addDays = (day: string, days: number): string => dayOf(dayNumber(day) + days)

/** Today's day in UTC. */
export const today = (now: Date = new Date()): string => now.toISOString().slice(0, 10)

export interface Clash {
  /** the two days that are too close (the same day twice for two takes on one day) */
  first: string
  second: string
}

/** Pairs of neighbouring planned days closer than the cadence, in date order. */
export function clashesOf(days: readonly string[], cadenceDays: number): Clash[] {
  const sorted = [...days].sort()
  const clashes: Clash[] = []
  for (let i = 1; i < sorted.length; i++) {
    const first = sorted[i - 1]!
    const second = sorted[i]!
    if (dayNumber(second) - dayNumber(first) < cadenceDays) clashes.push({ first, second })
  }
  return clashes
}

/** Days that take part in a clash. */
export function clashDays(days: readonly string[], cadenceDays: number): Set<string> {
  return new Set(clashesOf(days, cadenceDays).flatMap((c) => [c.first, c.second]))
}

/**
 * The days without an episode where the cadence wanted one: after each planned day, from a cadence later
 * up to the day before the next planned one, when that comes later than the cadence.
 */
export function gapDays(days: readonly string[], cadenceDays: number): string[] {
  const numbers = [...new Set(days.map(dayNumber))].sort((a, b) => a - b)
  const gaps: string[] = []
  for (let i = 1; i < numbers.length; i++) {
    for (let n = numbers[i - 1]! + cadenceDays; n < numbers[i]!; n++) gaps.push(dayOf(n))
  }
  return gaps
}

/** The first day on or after `from` at least a cadence away from every planned day. */
export function nextFreeSlot(days: readonly string[], cadenceDays: number, from: string): string {
  const taken = [...new Set(days.map(dayNumber))].sort((a, b) => a - b)
  let candidate = dayNumber(from)
  // each planned day pushes the candidate past its own reach at most once, so one pass in date order settles it
  for (const n of taken) {
    if (Math.abs(candidate - n) < cadenceDays) candidate = n + cadenceDays
  }
  return dayOf(candidate)
}

/** The weeks of a month's calendar, Monday first (ISO 8601), each day of the grid with whether it is in the month. */
export function monthGrid(year: number, month: number): { day: string; inMonth: boolean }[][] {
  const first = Math.round(Date.UTC(year, month - 1, 1) / DAY_MS)
  const last = Math.round(Date.UTC(year, month, 0) / DAY_MS)
  // 1970-01-01 was a Thursday: (n + 3) % 7 is 0 on Mondays
  const start = first - ((first + 3) % 7)
  const weeks: { day: string; inMonth: boolean }[][] = []
  for (let weekStart = start; weekStart <= last; weekStart += 7) {
    weeks.push(Array.from({ length: 7 }, (_, i) => ({ day: dayOf(weekStart + i), inMonth: weekStart + i >= first && weekStart + i <= last })))
  }
  return weeks
}
