/**
 * Merging two people's edits line by line. The outline is Project Euler problem 96, grid 01
 * (tests/fixtures/classic-puzzles.json) through our engine and script writer; the rule checked is the
 * three-way merge of version control (a change on one side only is taken; on both sides it conflicts).
 */
import { describe, expect, test } from 'vitest'
import { outlineSchema } from '../../../shared/schemas/outline'
import { editLineText, foldLines, hideLine, setPace, type Outline } from '../../../shared/script/index'
import { conflictKey, mergeScripts, settleMerge } from '../../../shared/takes/merge-scripts'
import { outlineFor } from '../../helpers/studio-outline'

const base: Outline = outlineFor('PE01')
const steps = base.lines.filter((l) => l.kind === 'step')
const lineText = (o: Outline, id: number) => o.lines.find((l) => l.id === id)!.text

describe('mergeScripts', () => {
  test('takes each side’s change to different lines, with no conflict', () => {
    const mine = editLineText(base, steps[1].id, 'Mine, on line two.')
    const theirs = hideLine(editLineText(base, steps[4].id, 'Theirs, on line five.'), steps[6].id)
    const { merged, conflicts } = mergeScripts(base, mine, theirs)
    expect(conflicts).toEqual([])
    expect(lineText(merged, steps[1].id)).toBe('Mine, on line two.')
    expect(lineText(merged, steps[4].id)).toBe('Theirs, on line five.')
    expect(merged.lines.find((l) => l.id === steps[6].id)!.hidden).toBe(true)
    expect(outlineSchema.safeParse(merged).success).toBe(true)
  })

  test('asks only about the line both changed, and settles it either way', () => {
    const mine = editLineText(editLineText(base, steps[2].id, 'My words.'), steps[3].id, 'Only mine here.')
    const theirs = editLineText(base, steps[2].id, 'Their words.')
    const merge = mergeScripts(base, mine, theirs)
    expect(merge.conflicts.map(conflictKey)).toEqual([`line-${steps[2].id}`])
    expect(lineText(merge.merged, steps[3].id)).toBe('Only mine here.')
    expect(lineText(settleMerge(merge, { [`line-${steps[2].id}`]: 'mine' }), steps[2].id)).toBe('My words.')
    expect(lineText(settleMerge(merge, {}), steps[2].id)).toBe('Their words.')
  })

  test('the same change on both sides is no conflict', () => {
    const edit = (o: Outline) => editLineText(o, steps[2].id, 'Both of us wrote this.')
    expect(mergeScripts(base, edit(base), edit(base)).conflicts).toEqual([])
  })

  test('a pace changed on one side re-times the other side’s lines', () => {
    const mine = editLineText(base, steps[0].id, 'A rather longer line of my own words than before.')
    const theirs = setPace(base, 220)
    const { merged, conflicts } = mergeScripts(base, mine, theirs)
    expect(conflicts).toEqual([])
    expect(merged.pace).toBe(220)
    expect(merged).toEqual(setPace(editLineText(base, steps[0].id, 'A rather longer line of my own words than before.'), 220))
  })

  test('a fold on one side keeps the other side’s edits only where they can be placed; otherwise the lines conflict as a whole', () => {
    const folded = foldLines(base, [steps[0].id, steps[1].id])
    expect(mergeScripts(base, folded, setPace(base, 200)).conflicts).toEqual([])
    const merge = mergeScripts(base, folded, editLineText(base, steps[5].id, 'Theirs.'))
    expect(merge.conflicts.map(conflictKey)).toEqual(['lines'])
    expect(settleMerge(merge, { lines: 'mine' }).lines.map((l) => l.id)).toEqual(folded.lines.map((l) => l.id))
  })

  test('without the base every difference is asked about', () => {
    const mine = editLineText(base, steps[1].id, 'Kept in this browser.')
    expect(mergeScripts(null, mine, base).conflicts.map(conflictKey)).toEqual([`line-${steps[1].id}`])
  })
})
