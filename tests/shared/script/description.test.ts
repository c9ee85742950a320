// Issue #13 item 10: the description says the rules, marks a missing link, and says when times are estimates.
// Chapter lines "m:ss Title", the first at 0:00, are common practice for video descriptions.
import { describe, expect, test } from 'vitest'
import { alignLine, buildOutline, timeline, toDescription } from '../../../shared/script/index'
import { LINK_MISSING_MARK } from '../../../shared/script/description'
import { hiddenSingle, nakedSingle, puzzle, rc, result } from './steps'

const steps = [nakedSingle(rc(1, 1)), hiddenSingle(rc(5, 5)), nakedSingle(rc(9, 9))]

describe('toDescription', () => {
  test('a rules line names the thermometers, or none for a classic puzzle', () => {
    const thermo = toDescription(buildOutline(puzzle(), result(steps), { link: 'https://example.com/p/3' })).split('\n')
    expect(thermo[2]).toBe('Rules: normal sudoku, with the digits 1 to 9 once in every row, column and 3 by 3 box; along each of the two thermometers, digits rise from the bulb to the tip.')
    const classic = toDescription(buildOutline(puzzle({ thermometers: [] }), result(steps), { link: 'https://example.com/p/3' })).split('\n')
    expect(classic[2]).not.toMatch(/thermometer/)
  })

  test('a missing link is marked plainly; a real one is not', () => {
    expect(toDescription(buildOutline(puzzle(), result(steps))).split('\n')[1]).toBe(`Try it yourself: [puzzle link] ${LINK_MISSING_MARK}`)
    expect(toDescription(buildOutline(puzzle(), result(steps), { link: 'https://example.com/p/3' }))).not.toContain(LINK_MISSING_MARK)
  })

  test('times are said to be estimates until every line is aligned', () => {
    const o = buildOutline(puzzle(), result(steps), { link: 'https://example.com/p/3' })
    expect(toDescription(o)).toMatch(/Times are estimates until the recording is aligned\.\n$/)
    let aligned = o
    let at = 0
    for (const line of o.lines) {
      aligned = alignLine(aligned, line.id, at)
      at += line.estMs
    }
    expect(timeline(aligned).source).toBe('aligned')
    expect(toDescription(aligned)).not.toMatch(/estimates/)
    expect(toDescription(aligned)).toMatch(/\n0:00 The rules\n/)
  })
})
