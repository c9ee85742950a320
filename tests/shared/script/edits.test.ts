import { describe, expect, test } from 'vitest'
import {
  applyEdit,
  buildOutline,
  editLineText,
  foldLines,
  hideLine,
  removeChapter,
  renameChapter,
  revertLineText,
  setNames,
  setTarget,
  showLine,
  splitLine,
  startChapterAt,
  type Outline,
} from '../../../shared/script/index'
import { THERMO_A, hiddenSingle, nakedPair, nakedSingle, puzzle, rc, result, thermoLength } from './steps'
import { outlineSchema } from '../../../shared/schemas/outline'

function deepFreeze<T>(o: T): T {
  if (o && typeof o === 'object') {
    Object.values(o).forEach(deepFreeze)
    Object.freeze(o)
  }
  return o
}

const steps = [
  thermoLength(0, THERMO_A),
  hiddenSingle(rc(9, 9)),
  nakedSingle(rc(4, 4)),
  hiddenSingle(rc(5, 5)),
  nakedSingle(rc(6, 6)),
  nakedPair({ kind: 'column', index: 0 }, [rc(2, 1), rc(7, 1)], [1, 9], [rc(8, 1)]),
]
const base: Outline = deepFreeze(buildOutline(puzzle(), result(steps)))
const run = base.lines.find((l) => l.steps.length === 3)!

describe('edit operations', () => {
  test('edits return a new outline and never change the input or the engine steps', () => {
    const next = editLineText(base, base.lines[1].id, 'Our own words here.')
    expect(next).not.toBe(base)
    expect(base.lines[1].edited).toBe(false)
    expect(next.lines[1]).toMatchObject({ text: 'Our own words here.', edited: true })
    expect(next.steps).toEqual(base.steps)
    expect(next.lines[1].estMs).toBeLessThan(base.lines[1].estMs)
  })

  test('editLineText(missing line) => "line 99 does not exist"; empty text is refused', () => {
    expect(() => editLineText(base, 99, 'x')).toThrow('line 99 does not exist')
    expect(() => editLineText(base, base.lines[1].id, '   ')).toThrow(`line ${base.lines[1].id} can't be empty; hide it instead`)
  })

  test('revertLineText renders the line again', () => {
    const edited = editLineText(base, base.lines[1].id, 'Mine.')
    expect(revertLineText(edited, base.lines[1].id).lines[1]).toEqual(base.lines[1])
  })

  test('splitLine then foldLines: back to one line per step, then one line again, same steps', () => {
    const split = splitLine(base, run.id)
    const parts = split.lines.filter((l) => run.steps.includes(l.steps[0]))
    expect(parts.map((l) => l.steps)).toEqual(run.steps.map((s) => [s]))
    expect(parts[0].id).toBe(run.id)
    expect(new Set(split.lines.map((l) => l.id)).size).toBe(split.lines.length)
    const folded = foldLines(split, parts.map((l) => l.id))
    expect(folded.lines.map((l) => l.steps)).toEqual(base.lines.map((l) => l.steps))
    expect(() => splitLine(base, base.lines[1].id)).toThrow(`line ${base.lines[1].id} covers a single step and can't be split`)
  })

  test('foldLines refuses lines that are not neighbours, the intro, and folds across a chapter', () => {
    expect(() => foldLines(base, [base.lines[1].id, base.lines[3].id])).toThrow('are not next to each other')
    expect(() => foldLines(base, [base.lines[0].id, base.lines[1].id])).toThrow(`line ${base.lines[0].id} is the intro and can't be folded`)
    const withChapter = startChapterAt(base, base.lines[2].id, 'Middle')
    expect(() => foldLines(withChapter, [base.lines[1].id, base.lines[2].id])).toThrow(`line ${base.lines[2].id} starts the chapter "Middle"`)
  })

  test('folding keeps a person\'s words', () => {
    const edited = editLineText(base, base.lines[1].id, 'First bit.')
    const folded = foldLines(edited, [base.lines[1].id, base.lines[2].id])
    expect(folded.lines[1]).toMatchObject({ edited: true, steps: [0, 1] })
    expect(folded.lines[1].text.startsWith('First bit. ')).toBe(true)
  })

  test('hideLine / showLine', () => {
    const hidden = hideLine(base, base.lines[1].id)
    expect(hidden.lines[1].hidden).toBe(true)
    expect(() => hideLine(hidden, base.lines[1].id)).toThrow(`line ${base.lines[1].id} is already hidden`)
    expect(showLine(hidden, base.lines[1].id)).toEqual(base)
    expect(() => showLine(base, base.lines[1].id)).toThrow(`line ${base.lines[1].id} is not hidden`)
  })

  test('chapters: start, rename, remove; the first chapter stays', () => {
    // a step line that doesn't start a chapter of its own yet (the line after the break-in does)
    const id = base.lines.find((l) => l.kind === 'step' && !base.chapters.some((c) => c.lineId === l.id))!.id
    const added = startChapterAt(base, id)
    const ch = added.chapters.find((c) => c.lineId === id)!
    expect(ch.title.length).toBeGreaterThan(0)
    expect(added.chapters.map((c) => added.lines.findIndex((l) => l.id === c.lineId))).toEqual(
      [...added.chapters.map((c) => added.lines.findIndex((l) => l.id === c.lineId))].sort((a, b) => a - b),
    )
    expect(() => startChapterAt(added, id)).toThrow(`line ${id} already starts a chapter`)
    const renamed = renameChapter(added, id, '  Into the middle ')
    expect(renamed.chapters.find((c) => c.lineId === id)).toMatchObject({ title: 'Into the middle', edited: true })
    expect(() => renameChapter(added, id, ' ')).toThrow("a chapter title can't be empty")
    expect(removeChapter(renamed, id).chapters).toEqual(base.chapters)
    expect(() => removeChapter(base, 99)).toThrow('no chapter starts at line 99')
    expect(() => removeChapter(base, base.chapters[0].lineId)).toThrow(/first chapter/)
  })

  test('setNames re-renders unedited lines only', () => {
    const edited = editLineText(base, base.lines[2].id, 'My own line about row 9, column 9.')
    const coords = setNames(edited, 'coords')
    expect(coords.names).toBe('coords')
    expect(coords.lines[2].text).toBe('My own line about row 9, column 9.')
    expect(coords.lines.filter((l) => !l.edited && l.kind === 'step').every((l) => !/row \d, column \d/.test(l.text))).toBe(true)
    expect(setNames(coords, 'words').lines).toEqual(edited.lines)
  })

  test('setTarget validates against the intro', () => {
    expect(setTarget(base, 600_000).targetMs).toBe(600_000)
    expect('targetMs' in setTarget(setTarget(base, 600_000), null)).toBe(false)
    expect(() => setTarget(base, 1)).toThrow(/shorter than the intro/)
    expect(() => setTarget(base, 25 * 3_600_000)).toThrow('target length must be under 24 hours (got 25:00:00)')
  })

  test('every edit result still passes the outline schema, even at the limits', () => {
    expect(() => applyEdit(base, { op: 'alignLine', lineId: base.lines[1].id, startMs: 3e9 })).toThrow(/from 0 to under 24 hours/)
    const aligned = applyEdit(base, { op: 'alignLine', lineId: base.lines[1].id, startMs: 24 * 3_600_000 - 1 })
    expect(outlineSchema.safeParse(aligned).success).toBe(true)
  })

  test('applyEdit(data) validates the operation and runs it', () => {
    expect(applyEdit(base, { op: 'hideLine', lineId: base.lines[1].id })).toEqual(hideLine(base, base.lines[1].id))
    expect(() => applyEdit(base, { op: 'explode' })).toThrow(/^invalid edit: op:/)
    expect(() => applyEdit(base, { op: 'setPace', pace: 0 })).toThrow('pace must be between 60 and 400 words a minute (got 0)')
    expect(() => applyEdit(base, { op: 'splitLine', lineId: 7 })).toThrow('line 7 does not exist')
  })
})
