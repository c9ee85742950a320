import { describe, expect, it } from 'vitest'
import { parseStartTime, parseStepHash } from '@/episode/deep-link'

describe('parseStartTime (?t=)', () => {
  it('should read plain seconds, h/m/s units and clock times', () => {
    expect(parseStartTime('90')).toBe(90_000)
    expect(parseStartTime('12.5')).toBe(12_500)
    expect(parseStartTime('1m30s')).toBe(90_000)
    expect(parseStartTime('1M30S')).toBe(90_000)
    expect(parseStartTime('45s')).toBe(45_000)
    expect(parseStartTime('2m')).toBe(120_000)
    expect(parseStartTime('1h2m3s')).toBe(3_723_000)
    expect(parseStartTime('1:30')).toBe(90_000)
    expect(parseStartTime('1:02:03')).toBe(3_723_000)
  })

  it('should ignore what it cannot read, rather than start somewhere surprising', () => {
    for (const raw of [null, '', ' ', 'abc', '-5', '1m30', 'm', '1:75', '1:5', '1:60:00', '90x', '1e3', 'Infinity']) expect(parseStartTime(raw)).toBeNull()
  })
})

describe('parseStepHash (#step-n)', () => {
  it('should read the item number of #step-n and nothing else', () => {
    expect(parseStepHash('#step-1')).toBe(1)
    expect(parseStepHash('#step-12')).toBe(12)
    for (const hash of ['', '#', '#step-0', '#step-', '#step-01', '#step-12a', '#steps-2', 'step-2', '#step-123456']) expect(parseStepHash(hash)).toBeNull()
  })
})
