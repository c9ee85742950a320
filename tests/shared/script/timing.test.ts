import { describe, expect, test } from 'vitest'
import { TIMING, alignLine, applyEdit, buildOutline, editLineText, fitToTarget, hideLine, setPace, timeline, type Outline } from '../../../shared/script/index'
import { THERMO_A, hiddenSingle, nakedSingle, puzzle, rc, result, thermoLength } from './steps'

const words = (n: number) => Array.from({ length: n }, () => 'word').join(' ')
/** Every cell once, ordered so that each row is placed in full before the next: long folded runs. */
const ALL_CELLS = Array.from({ length: 81 }, (_, c) => c)

describe('timing model', () => {
  test('1,600 words at 160 wpm => 10 minutes plus the action and pause time the model adds', () => {
    // Trade check (common practice): presenters narrate a full solve at about 150–190 words a minute,
    // so 1,600 words at 160 wpm is 1600 / 160 = 10 minutes of speech.
    const steps = ALL_CELLS.slice(0, 40).map((c) => hiddenSingle(c))
    let o: Outline = buildOutline(puzzle(), result(steps), { pace: 160 })
    const n = o.lines.length
    const perLine = Array.from({ length: n }, (_, i) => Math.floor(1600 / n) + (i < 1600 % n ? 1 : 0))
    expect(perLine.reduce((a, b) => a + b, 0)).toBe(1600)
    o.lines.forEach((l, i) => {
      o = editLineText(o, l.id, words(perLine[i]))
    })
    // Actions: one digit per step, no pencil marks in these steps; one pause per line.
    const expected = 10 * 60_000 + steps.length * TIMING.placementMs + n * TIMING.pauseMs
    expect(timeline(o).totalMs).toBeCloseTo(expected, -1)
    expect(Math.abs(timeline(o).totalMs - expected)).toBeLessThanOrEqual(n) // per-line rounding to whole ms
  })

  test('pencil marks and eliminations add mark time', () => {
    const o = buildOutline(puzzle(), result([thermoLength(0, THERMO_A)]), { pace: 160 })
    const line = o.lines[1]
    const spoken = line.text.split(/\s+/).filter((w) => /[\p{L}\p{N}]/u.test(w)).length
    // three cells newly marked + three cells losing candidates = six marks
    expect(line.estMs).toBe(Math.round((spoken / 160) * 60_000 + 6 * TIMING.markMs + TIMING.pauseMs))
  })

  test('timeline(outline) => cumulative starts, hidden lines take no time', () => {
    const o = buildOutline(puzzle(), result([hiddenSingle(rc(1, 1)), nakedSingle(rc(5, 5)), hiddenSingle(rc(9, 9))]))
    const t = timeline(o)
    let at = 0
    t.lines.forEach((l, i) => {
      expect(l.startMs).toBe(at)
      expect(l.durationMs).toBe(o.lines[i].estMs)
      at += l.durationMs
    })
    expect(t.totalMs).toBe(at)
    expect(t.source).toBe('estimated')
    const hidden = hideLine(o, o.lines[2].id)
    const th = timeline(hidden)
    expect(th.lines[2]).toMatchObject({ hidden: true, durationMs: 0, startMs: th.lines[3].startMs })
    expect(th.totalMs).toBe(t.totalMs - o.lines[2].estMs)
  })

  test('aligned starts replace estimates once a recording is aligned', () => {
    const o = buildOutline(puzzle(), result([hiddenSingle(rc(1, 1)), nakedSingle(rc(5, 5))]))
    let a = alignLine(o, o.lines[0].id, 2_000)
    a = alignLine(a, o.lines[1].id, 40_000)
    const t = timeline(a)
    expect(t.source).toBe('mixed')
    expect(t.lines[0]).toMatchObject({ startMs: 2_000, durationMs: 38_000, aligned: true })
    expect(t.lines[1].startMs).toBe(40_000)
    expect(t.lines[2].startMs).toBe(40_000 + o.lines[1].estMs)
    expect(() => alignLine(a, o.lines[2].id, 39_000)).toThrow(`line ${o.lines[2].id} can't start before line ${o.lines[1].id}, which starts at 40000 ms`)
  })

  test('a trim counts every time from the cut-in point and ends the video at the cut-out point', () => {
    const o = buildOutline(puzzle(), result([hiddenSingle(rc(1, 1)), nakedSingle(rc(5, 5))]))
    let a = alignLine(o, o.lines[0].id, 2_000)
    a = alignLine(a, o.lines[1].id, 40_000)
    a = alignLine(a, o.lines[2].id, 70_000)
    const trimmed = applyEdit(a, { op: 'setTrim', inMs: 1_500, outMs: 90_000 })
    expect(trimmed.trim).toEqual({ inMs: 1_500, outMs: 90_000 })
    // recording time stays on the lines; the timeline is in video time
    expect(trimmed.lines[1].alignedStartMs).toBe(40_000)
    const t = timeline(trimmed)
    expect(t.lines.map((l) => l.startMs)).toEqual([500, 38_500, 68_500, ...t.lines.slice(3).map((l) => l.startMs)])
    expect(t.totalMs).toBe(88_500)
    expect(t.lines.at(-1)!.endMs).toBe(88_500)
    // a cut-in after a line's start cuts that line's opening: it starts the video
    expect(timeline(applyEdit(a, { op: 'setTrim', inMs: 3_000, outMs: null })).lines[0].startMs).toBe(0)
    expect(applyEdit(trimmed, { op: 'setTrim', inMs: null, outMs: null }).trim).toBeUndefined()
    expect(() => applyEdit(a, { op: 'setTrim', inMs: 5_000, outMs: 5_000 })).toThrow('the video must end after it starts: out (5000 ms) must be after in (5000 ms)')
    expect(() => applyEdit(a, { op: 'setTrim', inMs: -1, outMs: null })).toThrow(/in point must be a number of milliseconds/)
  })

  test('setPace(outline, p) re-estimates every line; absurd paces are refused', () => {
    const o = buildOutline(puzzle(), result([hiddenSingle(rc(1, 1))]), { pace: 160 })
    const slow = setPace(o, 80)
    expect(timeline(slow).totalMs).toBeGreaterThan(timeline(o).totalMs)
    expect(() => setPace(o, 0)).toThrow('pace must be between 60 and 400 words a minute (got 0)')
    expect(() => setPace(o, 1000)).toThrow('pace must be between 60 and 400 words a minute (got 1000)')
  })
})

describe('fitToTarget', () => {
  // A whole grid placed by singles: a long clean-up that fitting can fold and hide.
  const steps = ALL_CELLS.map((c) => (c % 2 ? nakedSingle(c) : hiddenSingle(c)))
  const o = buildOutline(puzzle({ thermometers: [] }), result(steps))
  const total = timeline(o).totalMs

  test('already short enough => no suggestions', () => {
    const fit = fitToTarget(o, total + 1000)
    expect(fit).toMatchObject({ suggestions: [], newTotalMs: total, reached: true })
  })

  test('folds runs first, then hides easy lines, and reports the new total', () => {
    const target = Math.round(total * 0.6)
    const fit = fitToTarget(o, target)
    expect(fit.currentMs).toBe(total)
    expect(fit.reached).toBe(true)
    expect(fit.newTotalMs).toBeLessThanOrEqual(target)
    expect(fit.newTotalMs).toBe(timeline(fit.outline).totalMs)
    const kinds = fit.suggestions.map((s) => s.action)
    expect(kinds[0]).toBe('fold')
    expect(kinds.lastIndexOf('fold')).toBeLessThan(kinds.indexOf('hide') === -1 ? Infinity : kinds.indexOf('hide'))
    expect(fit.suggestions.reduce((a, s) => a + s.savesMs, 0)).toBe(total - fit.newTotalMs)
    // The break-in, intro, outro and chapter starts are kept.
    const shown = fit.outline.lines.filter((l) => !l.hidden).map((l) => l.id)
    for (const c of fit.outline.chapters) expect(shown).toContain(c.lineId)
    expect(fit.outline.lines.find((l) => l.steps.includes(0))!.hidden).toBe(false)
    expect(fit.outline.lines[0].hidden).toBe(false)
    expect(fit.outline.steps).toEqual(o.steps)
  })

  test('an unreachable target says so', () => {
    const intro = o.lines[0].estMs
    const fit = fitToTarget(o, intro + 1)
    expect(fit.reached).toBe(false)
    expect(fit.newTotalMs).toBeGreaterThan(intro + 1)
  })

  test('a target shorter than the intro => error', () => {
    expect(() => fitToTarget(o, 1000)).toThrow(/^target 0:01 is shorter than the intro/)
    expect(() => fitToTarget(o)).toThrow("no target length: pass one or set the outline's target first")
  })

  test('uses the outline\'s own target', () => {
    const withTarget = buildOutline(puzzle({ thermometers: [] }), result(steps), { targetMs: Math.round(total * 0.8) })
    expect(fitToTarget(withTarget).targetMs).toBe(Math.round(total * 0.8))
  })
})

