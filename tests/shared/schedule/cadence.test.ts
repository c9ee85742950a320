/**
 * The calendar sums against facts of the Gregorian calendar (weekdays checked with GNU date(1):
 * `date -d 2026-12-01 +%A` → Tuesday, `date -d 2027-02-01 +%A` → Monday; 2028 is a leap year and 2027
 * is not, by the calendar's rule) and a cadence of one episode every 3 days (common practice).
 */
import { describe, expect, it } from 'vitest'
import { addDays, clashDays, clashesOf, dayNumber, gapDays, monthGrid, nextFreeSlot } from '../../../shared/schedule/cadence'

describe('days', () => {
  it('should count across month ends and leap days as the calendar does', () => {
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29') // 2028 is a leap year
    expect(addDays('2027-02-28', 1)).toBe('2027-03-01') // 2027 is not
    expect(addDays('2026-12-30', 3)).toBe('2027-01-02')
    expect(dayNumber('2027-01-01') - dayNumber('2026-01-01')).toBe(365)
    expect(dayNumber('2029-01-01') - dayNumber('2028-01-01')).toBe(366)
  })
})

describe('clashes', () => {
  it('should name two takes on one day, and two closer than the cadence', () => {
    expect(clashesOf(['2026-12-10', '2026-12-04', '2026-12-04'], 3)).toEqual([{ first: '2026-12-04', second: '2026-12-04' }])
    expect(clashesOf(['2026-12-01', '2026-12-03'], 3)).toEqual([{ first: '2026-12-01', second: '2026-12-03' }])
  })

  it('should find none when every take is a cadence apart or more', () => {
    expect(clashesOf(['2026-12-01', '2026-12-04', '2026-12-07', '2026-12-12'], 3)).toEqual([])
    expect(clashDays(['2026-12-01', '2026-12-02'], 1)).toEqual(new Set())
  })
})

describe('gaps', () => {
  it('should mark the days an episode was due but none is planned', () => {
    // every 3 days from the 1st: due on the 4th and the 7th, the next one only on the 9th
    expect(gapDays(['2026-12-01', '2026-12-09'], 3)).toEqual(['2026-12-04', '2026-12-05', '2026-12-06', '2026-12-07', '2026-12-08'])
  })

  it('should mark nothing when the dates keep the cadence, and count a late day across a month end', () => {
    expect(gapDays(['2026-12-01', '2026-12-04', '2026-12-07'], 3)).toEqual([])
    expect(gapDays(['2026-11-28', '2026-12-02'], 3)).toEqual(['2026-12-01'])
  })
})

describe('next free slot', () => {
  it('should be the first day when nothing is planned', () => {
    expect(nextFreeSlot([], 3, '2026-12-02')).toBe('2026-12-02')
  })

  it('should follow the last planned day by the cadence', () => {
    expect(nextFreeSlot(['2026-12-01', '2026-12-04'], 3, '2026-12-02')).toBe('2026-12-07')
  })

  it('should fill a gap wide enough for a take a cadence from both sides', () => {
    expect(nextFreeSlot(['2026-12-01', '2026-12-10'], 3, '2026-12-01')).toBe('2026-12-04')
  })

  it('should never make a clash', () => {
    const planned = ['2026-12-03', '2026-12-05', '2026-12-06', '2026-12-12', '2026-12-14']
    for (let from = 0; from < 20; from++) {
      const slot = nextFreeSlot(planned, 3, addDays('2026-12-01', from))
      expect(clashesOf([...planned, slot], 3).filter((c) => c.first === slot || c.second === slot)).toEqual([])
      expect(dayNumber(slot)).toBeGreaterThanOrEqual(dayNumber(addDays('2026-12-01', from)))
    }
  })
})

describe('month grid', () => {
  it('should start on the Monday before the 1st and end with the week of the last day', () => {
    const december = monthGrid(2026, 12) // 1 December 2026 is a Tuesday
    expect(december[0]![0]).toEqual({ day: '2026-11-30', inMonth: false })
    expect(december[0]![1]).toEqual({ day: '2026-12-01', inMonth: true })
    expect(december.at(-1)!.some((d) => d.day === '2026-12-31')).toBe(true)
    expect(december.flat().filter((d) => d.inMonth)).toHaveLength(31)
  })

  it('should start on the 1st itself when the month begins on a Monday', () => {
    const february = monthGrid(2027, 2) // 1 February 2027 is a Monday; 2027 is no leap year
    expect(february[0]![0]).toEqual({ day: '2027-02-01', inMonth: true })
    expect(february).toHaveLength(4)
    expect(monthGrid(2028, 2).flat().filter((d) => d.inMonth)).toHaveLength(29)
  })
})
