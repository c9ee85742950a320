// Issue #13 item 8: the difficulty guard's two signs, measured on the timeline (shared/script/timing.ts).
// The thresholds are the issue's: what-ifs over 20% of the time, over 3 minutes with no digit placed.
import { describe, expect, test } from 'vitest'
import { buildOutline, difficultyReport, hideLine, timeline } from '../../../shared/script/index'
import { contradiction, nakedSingle, puzzle, rc, result } from './steps'

// Twenty what-ifs in a row (none places a digit), then one digit.
const whatIfs = Array.from({ length: 20 }, (_, i) => contradiction(rc(1 + (i % 9), 1 + Math.floor(i / 9)), 2 + (i % 7), rc(9, 9)))
const outline = buildOutline(puzzle(), result([...whatIfs, nakedSingle(rc(5, 5))]))

describe('difficultyReport', () => {
  test('what-if time is the visible what-if lines\' share of the total, flagged over 20%', () => {
    const r = difficultyReport(outline)
    const t = timeline(outline)
    const whatIfLines = outline.lines.filter((l) => l.steps.some((k) => k < 20))
    const expected = whatIfLines.reduce((a, l) => a + t.lines.find((x) => x.id === l.id)!.durationMs, 0)
    expect(r.whatIfMs).toBe(expected)
    expect(r.whatIfShare).toBeCloseTo(expected / t.totalMs)
    expect(r.tooManyWhatIfs).toBe(true)
    expect(r.whatIfLineIds).toHaveLength(whatIfLines.length)
  })

  test('more than three minutes with no digit placed is a dry spell, from its first line to its last', () => {
    const r = difficultyReport(outline)
    const t = timeline(outline)
    expect(t.lines.filter((l) => l.kind === 'step' && l.id <= 21).reduce((a, l) => a + l.durationMs, 0)).toBeGreaterThan(3 * 60_000)
    expect(r.drySpells).toHaveLength(1)
    const [spell] = r.drySpells
    expect(spell.fromLineId).toBe(2)
    expect(spell.toLineId).toBe(21)
    expect(spell.startMs).toBe(t.lines[1].startMs)
    expect(spell.durationMs).toBe(t.lines[21].startMs - t.lines[1].startMs)
  })

  test('hiding lines shortens the spell; a script of singles raises nothing', () => {
    let cut = outline
    for (let id = 4; id <= 21; id++) cut = hideLine(cut, id)
    expect(difficultyReport(cut).drySpells).toEqual([])
    const easy = buildOutline(puzzle(), result([rc(1, 1), rc(5, 5), rc(9, 9)].map((c) => nakedSingle(c))))
    expect(difficultyReport(easy)).toMatchObject({ whatIfMs: 0, tooManyWhatIfs: false, drySpells: [] })
  })
})
