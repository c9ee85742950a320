import { describe, expect, test } from 'vitest'
import { compareRuns, type LineEstimate } from '../../../shared/rehearsal/compare'

const estimates: LineEstimate[] = [
  { lineId: 10, number: 1, text: 'a', estimateMs: 4000 },
  { lineId: 11, number: 2, text: 'b', estimateMs: 6000 },
  { lineId: 12, number: 3, text: 'c', estimateMs: 5000 },
]
const line = (lineId: number, ms: number, isBreak = false) => ({ lineId, ms, isBreak, work: { words: 1, placements: 0, marks: 0, whatIfMoves: 0 } })

describe('compareRuns', () => {
  test('totals and running totals by hand: a break counts nothing, a run that stopped early ends its line', () => {
    const full = { lines: [line(10, 5000), line(11, 70_000, true), line(12, 4500)] }
    const short = { lines: [line(10, 3000), line(11, 6500)] }
    const c = compareRuns(estimates, [full, short])
    expect(c.estimateTotalMs).toBe(15_000)
    // 5000 + (break: 0) + 4500 = 9500; 3000 + 6500 = 9500
    expect(c.runTotalsMs).toEqual([9500, 9500])
    expect(c.cumulative.estimate).toEqual([4000, 10_000, 15_000])
    expect(c.cumulative.runs).toEqual([
      [5000, 5000, 9500],
      [3000, 9500, null],
    ])
    expect(c.rows[2].runs).toEqual([{ ms: 4500, isBreak: false }, null])
  })
})
