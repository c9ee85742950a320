// Issue #13 item 7 (and #16 item 6): cut suggestions a presenter can say. Puzzle: hard-90010 of
// tests/fixtures/thermo-tiers.json (tests/helpers/thermo-tiers.ts), whose path has many what-ifs.
import { readFileSync } from 'node:fs'
import { beforeAll, describe, expect, test } from 'vitest'
import { parsePuzzle, solvePath } from '../../../shared/engine/index'
import { applyEdit, buildOutline, fitToTarget, timeline, type Outline } from '../../../shared/script/index'

let outline: Outline
beforeAll(() => {
  const file = JSON.parse(readFileSync(new URL('../../fixtures/thermo-tiers.json', import.meta.url), 'utf8')) as {
    tiers: { hard: { id: string; title: string; givens: string; thermometers: string[][] }[] }
  }
  const p = file.tiers.hard.find((x) => x.id === 'hard-90010')!
  const puzzle = parsePuzzle({ title: p.title, givens: p.givens, thermometers: p.thermometers }).puzzle!
  outline = buildOutline(puzzle, solvePath(puzzle), { names: 'coords' })
}, 30_000)

const isWhatIf = (o: Outline, id: number) => o.lines.find((l) => l.id === id)!.steps.some((k) => o.steps[k].facts.kind === 'contradiction')

describe('fitting a script with what-ifs', () => {
  test('what-ifs are said briefly when folding and hiding singles are not enough, and each stays true', () => {
    const total = timeline(outline).totalMs
    const fit = fitToTarget(outline, Math.round(total * 0.5))
    const shortened = fit.suggestions.filter((s) => s.action === 'shorten')
    expect(shortened.length).toBeGreaterThan(0)
    for (const s of shortened) {
      expect(isWhatIf(outline, s.lineIds[0])).toBe(true)
      const line = outline.lines.find((l) => l.id === s.lineIds[0])!
      const f = outline.steps[line.steps[0]].facts
      if (f.kind !== 'contradiction') throw new Error('not a what-if')
      // the assumption and the verdict survive the cut
      expect(s.text).toContain(`r${Math.floor(f.cell / 9) + 1}c${(f.cell % 9) + 1}`)
      expect(s.text).toMatch(new RegExp(`So it isn't an? ${f.assumed}\\.`))
      expect(s.text!.length).toBeLessThan(line.text.length)
    }
  })

  test('no line is both joined and hidden; joined lines keep every cell; savings add up to the stated total', () => {
    const total = timeline(outline).totalMs
    for (const share of [0.9, 0.7, 0.5, 0.2]) {
      const fit = fitToTarget(outline, Math.round(total * share))
      const joined = new Set(fit.suggestions.filter((s) => s.action === 'fold').map((s) => s.lineIds[0]))
      for (const s of fit.suggestions.filter((x) => x.action === 'hide')) expect(joined.has(s.lineIds[0])).toBe(false)
      expect(fit.suggestions.reduce((a, s) => a + s.savesMs, 0)).toBe(fit.currentMs - fit.newTotalMs)
      for (const id of joined) {
        const line = fit.outline.lines.find((l) => l.id === id)!
        for (const k of line.steps) for (const p of fit.outline.steps[k].placements) expect(line.text).toContain(`r${Math.floor(p.cell / 9) + 1}c${(p.cell % 9) + 1}`)
      }
      // the suggestions, sent as the studio sends them, give the same script
      let applied = applyEdit(outline, { op: 'setTarget', targetMs: fit.targetMs })
      for (const s of fit.suggestions) {
        applied = applyEdit(
          applied,
          s.action === 'fold' ? { op: 'foldLines', lineIds: s.lineIds } : s.action === 'hide' ? { op: 'hideLine', lineId: s.lineIds[0] } : { op: 'editLineText', lineId: s.lineIds[0], text: s.text! },
        )
      }
      expect(timeline(applied).totalMs).toBe(fit.newTotalMs)
    }
  })

  test('an unreachable target says why, naming what the what-ifs take', () => {
    const intro = outline.lines[0].estMs
    const fit = fitToTarget(outline, intro + 1000)
    expect(fit.reached).toBe(false)
    expect(fit.why).toMatch(/^What-ifs alone take \d+:\d\d, more than the whole \d+:\d\d target/)
    const near = fitToTarget(outline, Math.round(fit.newTotalMs * 0.95) + 0)
    if (!near.reached) expect(near.why).toMatch(/what-ifs|What-ifs/)
    expect(fitToTarget(outline, timeline(outline).totalMs).why).toBeUndefined()
  })
})
