import { dayNumber } from '@shared/schedule/cadence'

// spelt out here rather than by Intl: its short forms differ between ICU versions ("Fri 4 Dec" or "Fri, 4 Dec")
const WEEKDAYS = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun']
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec']
const MONTH_NAMES = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December']

/** A planned day for people: 'Thu 10 Dec 2026' (the day as the team plans it, in UTC). */
export function formatDay(day: string): string {
  const [year, month, date] = day.split('-').map(Number)
  // 1970-01-01 was a Thursday: (n + 3) % 7 is 0 on Mondays
  return `${WEEKDAYS[(dayNumber(day) + 3) % 7]} ${date} ${MONTHS[month! - 1]} ${year}`
}

/** A month's heading: 'December 2026'. */
export const formatMonth = (year: number, month: number): string => `${MONTH_NAMES[month - 1]} ${year}`
