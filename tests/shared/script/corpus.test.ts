// Issue #13 checks over long scripts: the hard tier of tests/fixtures/thermo-tiers.json (20 puzzles,
// minimal givens, five or more thermometers), solved by the engine and told in both naming styles.
// Each claim a line makes is read back from its text and checked against the grid as the engine's own
// board replays it (stateAt), not against the facts the line was written from: digits "in its row"
// are on the grid in that row, digits "ruled out earlier" are gone from the cell's candidates, a
// thermometer is named by a cell or box it really occupies. Sudoku facts used: a digit placed in a
// house blocks it from the house's other cells (common practice).
import { beforeAll, describe, expect, test } from 'vitest'
import { CELL_HOUSES, HOUSES, boxOf, colOf, houseCells, rowOf, type HouseRef } from '../../../shared/grid'
import type { Step } from '../../../shared/engine/index'
import { OPENER_WINDOW } from '../../../shared/script/build'
import { openerOf } from '../../../shared/script/pick'
import { SEGUES } from '../../../shared/script/phrasings'
import { thermoWords } from '../../../shared/script/words'
import { hardScripts, type CorpusScript } from '../../helpers/script-corpus'

let scripts: CorpusScript[] = []
beforeAll(() => {
  scripts = hardScripts()
}, 60_000)

type Kind = 'row' | 'column' | 'box'
const houseOfCell = (cell: number, kind: Kind): HouseRef => ({ kind, index: kind === 'row' ? rowOf(cell) : kind === 'column' ? colOf(cell) : boxOf(cell) })
const inHouse = (digits: ArrayLike<number>, h: HouseRef, d: number) => houseCells(h).some((c) => digits[c] === d)
const sees = (digits: ArrayLike<number>, cell: number, d: number) => Array.from(CELL_HOUSES[cell]).some((h) => Array.from(HOUSES[h]).some((c) => digits[c] === d))
const cellOf = (m: string) => (Number(m[1]) - 1) * 9 + Number(m[3]) - 1
const cellsIn = (text: string) => [...text.matchAll(/r(\d)c(\d)/g)].map((m) => (Number(m[1]) - 1) * 9 + Number(m[2]) - 1)
const digitsIn = (list: string) => [...list.matchAll(/\d/g)].map((m) => Number(m[0]))
const bit = (d: number) => 1 << (d - 1)

/** Every cell a step's record mentions, and those of the earlier steps a single leans on. */
function stepCells(steps: Step[], k: number): Set<number> {
  const out = new Set<number>()
  const add = (step: Step) => {
    step.focus.forEach((c) => out.add(c))
    step.placements.forEach((p) => out.add(p.cell))
    step.eliminations.forEach((e) => out.add(e.cell))
    step.reason.cells.forEach((c) => out.add(c))
    JSON.stringify(step.facts, (key, value: unknown) => {
      if (typeof value === 'number' && /cell|peer|pivot|end|fromCell|emptyCell/i.test(key)) out.add(value)
      if (Array.isArray(value) && /cells|pincers|eliminated/i.test(key)) value.forEach((c) => typeof c === 'number' && out.add(c))
      return value
    })
  }
  const step = steps[k]
  add(step)
  const f = step.facts
  if (f.kind === 'single-cell') f.ruledOutBy?.forEach((r) => add(steps[r.step]))
  if (f.kind === 'single-house') f.blockers?.forEach((b) => 'step' in b && add(steps[b.step]))
  return out
}

const stepLines = (s: CorpusScript, o: 'words' | 'coords') => s[o].lines.filter((l) => l.kind === 'step')

describe('every reason a single gives is true on the grid at that step', () => {
  test('hidden singles: each house said to hold the digit holds it; each cell a step "took it out of" has lost it', () => {
    let checked = 0
    for (const s of scripts) {
      for (const line of stepLines(s, 'coords')) {
        if (line.steps.length !== 1) continue
        const k = line.steps[0]
        const f = s.steps[k].facts
        if (f.kind !== 'single-house') continue
        const { digits, candidates } = s.before(k)
        const held = /((?:(?:[Rr]ow|[Cc]olumn|[Bb]ox) \d(?:, | and )?)+) already ha(?:s|ve) an? (\d)/.exec(line.text)
        if (held) {
          for (const m of held[1].matchAll(/(row|column|box) (\d)/gi)) {
            const h = { kind: m[1].toLowerCase() as Kind, index: Number(m[2]) - 1 }
            expect(inHouse(digits, h, f.digit), `${s.id} line ${line.id}: ${m[0]} holds ${f.digit}`).toBe(true)
            checked++
          }
        }
        for (const m of line.text.matchAll(/took it out of ((?:r\dc\d(?:, | and )?)+)/g)) {
          for (const c of cellsIn(m[1])) {
            expect(digits[c], `${s.id} line ${line.id}: r${rowOf(c) + 1}c${colOf(c) + 1} is empty`).toBe(0)
            expect(candidates[c] & bit(f.digit), `${s.id} line ${line.id}: ${f.digit} is gone from r${rowOf(c) + 1}c${colOf(c) + 1}`).toBe(0)
            checked++
          }
        }
      }
    }
    expect(checked).toBeGreaterThan(200)
  })

  test('last candidates: digits "in its row/column/box" are there; digits "ruled out earlier" are gone from the cell and not in sight', () => {
    let checked = 0
    for (const s of scripts) {
      for (const line of stepLines(s, 'coords')) {
        if (line.steps.length !== 1) continue
        const k = line.steps[0]
        const f = s.steps[k].facts
        if (f.kind !== 'single-cell') continue
        const { digits, candidates } = s.before(k)
        for (const m of line.text.matchAll(/(an? \d|\d(?:, \d)*(?: and \d)?) in its (row|column|box)/g)) {
          for (const d of digitsIn(m[1])) {
            expect(inHouse(digits, houseOfCell(f.cell, m[2] as Kind), d), `${s.id} line ${line.id}: ${d} in its ${m[2]}`).toBe(true)
            checked++
          }
        }
        const joint = /its ((?:row|column|box)(?:(?:, | and )(?:row|column|box))*) (?:already )?holds? ((?:\d(?:, | and )?)+)/.exec(line.text)
        if (joint) {
          const named = [...joint[1].matchAll(/row|column|box/g)].map((m) => houseOfCell(f.cell, m[0] as Kind))
          for (const d of digitsIn(joint[2])) expect(named.some((h) => inHouse(digits, h, d)), `${s.id} line ${line.id}: ${d} in ${joint[1]}`).toBe(true)
          for (const h of named) expect(digitsIn(joint[2]).some((d) => inHouse(digits, h, d)), `${s.id} line ${line.id}: its ${h.kind} holds one`).toBe(true)
          checked++
        }
        // "Count what r1c1 sees: 1, 2 … 9" and "Everything but a 5 is already in …" claim all eight in sight
        if (/ sees: |Everything but|the other eight are taken/.test(line.text)) {
          for (let d = 1; d <= 9; d++) if (d !== f.digit) expect(sees(digits, f.cell, d), `${s.id} line ${line.id}: ${d} is in sight`).toBe(true)
          checked++
        }
        for (const m of line.text.matchAll(/\b[Tt]he (\d(?:(?:, | and )\d)*) (?:was|were|with)\b/g)) {
          for (const d of digitsIn(m[1])) {
            expect(candidates[f.cell] & bit(d), `${s.id} line ${line.id}: ${d} was ruled out of the cell`).toBe(0)
            expect(sees(digits, f.cell, d), `${s.id} line ${line.id}: ${d} is not in sight, so it is not told as seen`).toBe(false)
            checked++
          }
        }
      }
    }
    expect(checked).toBeGreaterThan(100)
  })

  test('a bound starts from the cell as it stands: a placed digit is said as that digit, sighted digits are there', () => {
    let checked = 0
    for (const s of scripts) {
      for (const line of stepLines(s, 'coords')) {
        const k = line.steps[0]
        const f = s.steps[k].facts
        if (line.steps.length !== 1 || f.kind !== 'thermo-bounds') continue
        const { digits } = s.before(k)
        const from = `r${rowOf(f.fromCell) + 1}c${colOf(f.fromCell) + 1}`
        if (digits[f.fromCell] !== 0) {
          expect(line.text, `${s.id} line ${line.id}`).toMatch(new RegExp(`${from},? is an? ${digits[f.fromCell]}\\b`))
          expect(line.text).not.toMatch(new RegExp(`${from},? is (at least|at most)`))
        }
        for (const m of line.text.matchAll(/(an? \d|\d(?:, \d)*(?: and \d)?) in its (row|column|box)/g)) {
          for (const d of digitsIn(m[1])) expect(inHouse(digits, houseOfCell(f.fromCell, m[2] as Kind), d), `${s.id} line ${line.id}`).toBe(true)
        }
        expect(line.text).not.toMatch(/so on|and so forth/)
        checked++
      }
    }
    expect(checked).toBeGreaterThan(20)
  })

  test('folded lines hold only singles a viewer can check on the grid, and say every digit with its cell', () => {
    let runs = 0
    for (const s of scripts) {
      for (const line of stepLines(s, 'coords')) {
        if (line.steps.length < 2 || !line.steps.every((k) => s.steps[k].technique.endsWith('single'))) continue
        runs++
        for (const k of line.steps) {
          const step = s.steps[k]
          const { digits } = s.before(k)
          const { cell, digit } = step.placements[0]
          expect(line.text, `${s.id} line ${line.id}`).toContain(`r${rowOf(cell) + 1}c${colOf(cell) + 1} is ${digit}`)
          const f = step.facts
          if (f.kind === 'single-cell') {
            for (let d = 1; d <= 9; d++) if (d !== digit) expect(sees(digits, cell, d), `${s.id} line ${line.id}: ${d} in sight of the cell`).toBe(true)
          } else if (f.kind === 'single-house') {
            for (const other of houseCells(f.house)) {
              if (other !== cell && digits[other] === 0) expect(sees(digits, other, digit), `${s.id} line ${line.id}: the ${digit} blocks cell ${other}`).toBe(true)
            }
          }
        }
      }
    }
    expect(runs).toBeGreaterThan(50)
  })
})

describe('every house and thermometer named is the one the line is about', () => {
  test('each row, column or box named holds a cell the step (or a step it leans on) is about', () => {
    for (const s of scripts) {
      for (const line of stepLines(s, 'coords')) {
        const cells = new Set([...line.steps.flatMap((k) => [...stepCells(s.steps, k)]), ...cellsIn(line.text)])
        // a what-if may break on a house none of its moves touch: the engine's emptyHouse, said as such
        const f = s.steps[line.steps[0]].facts
        const breaks = f.kind === 'contradiction' ? f.emptyHouse?.house : undefined
        for (const m of line.text.matchAll(/\b(row|column|box) (\d)\b/gi)) {
          const h = { kind: m[1].toLowerCase() as Kind, index: Number(m[2]) - 1 }
          if (breaks && breaks.kind === h.kind && breaks.index === h.index && line.text.includes(`${m[0]} would have nowhere`)) continue
          expect(houseCells(h).some((c) => cells.has(c)), `${s.id} line ${line.id}: ${m[0]} in "${line.text}"`).toBe(true)
        }
      }
    }
  })

  test('a thermometer is named by a cell or box it occupies, the same one in both styles, and holds a cell of the step', () => {
    let named = 0
    for (const s of scripts) {
      const paths = s.puzzle.thermometers
      const words = paths.map((_, t) => thermoWords(t, { style: 'words', thermometers: paths }))
      expect(new Set(words).size, `${s.id}: every thermometer has a name of its own`).toBe(paths.length)
      words.forEach((name, t) => {
        const box = /in the ([a-z-]+) box/.exec(name)
        if (box) {
          const boxIndex = ['top-left', 'top-middle', 'top-right', 'middle-left', 'central', 'middle-right', 'bottom-left', 'bottom-middle', 'bottom-right'].indexOf(box[1])
          expect(paths[t].filter((c) => boxOf(c) === boxIndex).length * 2, `${s.id}: ${name} lies mostly in that box`).toBeGreaterThan(paths[t].length)
        }
      })
      const byLongestName = words.map((w, t) => ({ w, t })).sort((a, b) => b.w.length - a.w.length)
      s.coords.lines.forEach((line, i) => {
        if (line.kind !== 'step') return
        const cells = new Set(line.steps.flatMap((k) => [...stepCells(s.steps, k)]))
        const inCoords = new Set<number>()
        for (const m of line.text.matchAll(/the (r\dc\d) thermometer/g)) {
          const t = paths.findIndex((p) => p[0] === cellOf(m[1]))
          expect(t, `${s.id} line ${line.id}: a thermometer starts at ${m[1]}`).toBeGreaterThanOrEqual(0)
          expect(paths[t].some((c) => cells.has(c)), `${s.id} line ${line.id}: ${m[0]} holds a cell of the step`).toBe(true)
          inCoords.add(t)
          named++
        }
        let rest = s.words.lines[i].text
        const inWords = new Set<number>()
        for (const { w, t } of byLongestName) {
          if (rest.includes(w)) inWords.add(t)
          rest = rest.split(w).join('')
        }
        expect([...inWords].sort(), `${s.id} line ${line.id}`).toEqual([...inCoords].sort())
      })
    }
    expect(named).toBeGreaterThan(200)
  })

  test('"this row/column/box" only right after a line about that same house', () => {
    for (const s of scripts) {
      const lines = s.words.lines
      lines.forEach((line, i) => {
        for (const m of line.text.matchAll(/\bthis (row|column|box)\b/g)) {
          const before = line.text.slice(0, m.index)
          const namedHere = m[1] === 'box' ? /\bbox\b/i.test(before) : new RegExp(`\\b${m[1]} \\d`, 'i').test(before)
          if (namedHere) continue
          const f = s.steps[line.steps[0]].facts
          expect(f.kind, `${s.id} line ${line.id}`).toBe('single-house')
          if (f.kind !== 'single-house') continue
          const prev = lines[i - 1]
          const last = s.steps[prev.steps[prev.steps.length - 1]]
          const cells = last.placements.length > 0 ? last.placements.map((p) => p.cell) : last.focus
          expect(cells.every((c) => houseCells(f.house).includes(c)), `${s.id} line ${line.id}: the line before is in that ${m[1]}`).toBe(true)
        }
      })
    }
  })
})

describe('chapters by content', () => {
  test('"Finding the break-in" ends at the break-in, and no chapter is followed by one about the same place', () => {
    for (const s of scripts) {
      const o = s.words
      const first = s.steps.findIndex((st) => st.placements.length > 0)
      const startStep = (lineId: number) => o.lines.find((l) => l.id === lineId)!.steps[0]
      if (o.chapters[1]?.title === 'Finding the break-in' && o.chapters[2]) expect(startStep(o.chapters[2].lineId), s.id).toBe(first + 1)
      const place = (title: string) => title.replace(/^Back to /, '').toLowerCase()
      o.chapters.slice(1).forEach((c, i) => expect(place(c.title), `${s.id}: ${o.chapters[i].title} / ${c.title}`).not.toBe(place(o.chapters[i].title)))
    }
  })
})

describe('variety over long scripts', () => {
  test(`no opener twice in any ${OPENER_WINDOW} lines in a row`, () => {
    for (const s of scripts) {
      const openers = s.words.lines.map((l) => openerOf(l.text))
      openers.forEach((o, i) => {
        const window = openers.slice(Math.max(0, i - OPENER_WINDOW + 1), i)
        expect(window, `${s.id} line ${i + 1} opens with "${o}"`).not.toContain(o)
      })
    }
  })

  test('filler phrases stay rare: no segue more than 6 times a script, no "the cell at", no skipped links', () => {
    for (const s of scripts) {
      const text = s.words.lines.map((l) => l.text).join('\n')
      for (const segue of SEGUES) expect(text.split(`\n${segue}`).length - 1, `${s.id}: "${segue}"`).toBeLessThanOrEqual(6)
      expect(text).not.toMatch(/the cell at row/)
      expect(text).not.toMatch(/steps later|so on along/)
      // thermometer lengths the engine takes one after another are said in one line, not one line each
      const lengthOnly = s.words.lines.map((l) => l.kind === 'step' && l.steps.every((k) => s.steps[k].facts.kind === 'thermo-length'))
      lengthOnly.forEach((only, i) => expect(only && lengthOnly[i + 1], `${s.id} line ${i + 1}`).toBeFalsy())
    }
  })
})
