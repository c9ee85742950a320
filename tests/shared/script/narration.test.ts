import { describe, expect, test } from 'vitest'
import { buildOutline, type Outline } from '../../../shared/script/index'
import type { Step } from '../../../shared/engine/types'
import {
  THERMO_A,
  THERMO_B,
  contradiction,
  hiddenPair,
  hiddenSingle,
  locked,
  nakedPair,
  nakedSingle,
  puzzle,
  rc,
  result,
  thermoBounds,
  thermoLength,
} from './steps'

// Cells where no two neighbours share a row, column or box, so singles are not folded together.
const SPREAD = [rc(1, 1), rc(5, 5), rc(9, 9), rc(2, 4), rc(6, 8), rc(7, 2), rc(3, 6), rc(8, 3), rc(4, 7)]

const stepLines = (o: Outline) => o.lines.filter((l) => l.kind === 'step')
/** The shape of a sentence with names and digits taken out: equal skeletons mean the same phrasing. */
const skeleton = (text: string) =>
  text
    .replace(/row \d, column \d|r\dc\d/g, 'C')
    .replace(/\d/g, '#')
    .split(/\s+/)
    .slice(0, 5)
    .join(' ')
const opener = (text: string) => (/^[^\p{L}\p{N}]*([\p{L}\p{N}']+)/u.exec(text)?.[1] ?? '').toLowerCase()

const TECHNIQUES: Record<string, Step[]> = {
  'naked-single': SPREAD.map((c) => nakedSingle(c)),
  'hidden-single': SPREAD.map((c, i) => hiddenSingle(c, (['box', 'row', 'column'] as const)[i % 3])),
  'naked-pair': [0, 1, 2, 3, 4, 5].map((i) => nakedPair({ kind: 'column', index: i }, [rc(2, i + 1), rc(7, i + 1)], [3, 8], [rc(4, i + 1)])),
  'hidden-pair': [0, 1, 2, 3, 4, 5].map((i) => hiddenPair({ kind: 'row', index: i }, [rc(i + 1, 2), rc(i + 1, 9)], [1, 7])),
  'locked-box-line': [0, 1, 2, 3, 4, 5].map((i) => locked(4, i, { kind: 'row', index: 3 * Math.floor(i / 3) }, 'box-to-line', [rc(3 * Math.floor(i / 3) + 1, 3 * (i % 3) + 1)], [rc(3 * Math.floor(i / 3) + 1, ((3 * (i % 3) + 4) % 9) + 1)])),
  'locked-line-box': [0, 1, 2, 3, 4, 5].map((i) => locked(6, i, { kind: 'column', index: 3 * (i % 3) }, 'line-to-box', [rc(3 * Math.floor(i / 3) + 1, 3 * (i % 3) + 1)], [rc(3 * Math.floor(i / 3) + 2, 3 * (i % 3) + 2)])),
  'thermo-length': [0, 1, 2, 3, 4, 5].map((i) => thermoLength(i % 2, i % 2 ? THERMO_B : THERMO_A)),
  'thermo-bounds': [0, 1, 2, 3, 4, 5].map((i) => thermoBounds(i % 2, i % 2 ? THERMO_B : THERMO_A, i % 3 === 0 ? 'max' : 'min', 4)),
  contradiction: [0, 1, 2, 3, 4, 5].map((i) => contradiction(SPREAD[i], 2 + i, rc(9, 1))),
}

describe('buildOutline narration', () => {
  for (const [technique, steps] of Object.entries(TECHNIQUES)) {
    test(`${technique}: at least three phrasings, and no two neighbouring lines open alike`, () => {
      const status = steps.some((s) => s.placements.length) ? 'solved' : 'stuck'
      const o = buildOutline(puzzle(), result(steps, status))
      const lines = stepLines(o)
      expect(lines).toHaveLength(steps.length)
      // The first line may carry a one-off explanation; look at the phrasings after it.
      expect(new Set(lines.slice(1).map((l) => skeleton(l.text))).size).toBeGreaterThanOrEqual(3)
      o.lines.slice(1).forEach((l, i) => expect(opener(l.text), `${o.lines[i].text} / ${l.text}`).not.toBe(opener(o.lines[i].text)))
    })
  }

  test('buildOutline(same input) => same script (deterministic)', () => {
    const steps = Object.values(TECHNIQUES).flat().slice(0, 40)
    const a = buildOutline(puzzle(), result(steps.filter((s) => s.placements.length === 0)))
    const b = buildOutline(puzzle(), result(steps.filter((s) => s.placements.length === 0)))
    expect(a).toEqual(b)
  })

  test('narration never reads Step.text', () => {
    const steps = TECHNIQUES['naked-pair']
    const a = buildOutline(puzzle(), result(steps, 'stuck'))
    const b = buildOutline(puzzle(), result(steps.map((s) => ({ ...s, text: 'something else entirely, 1 2 3' })), 'stuck'))
    expect(b.lines.map((l) => l.text)).toEqual(a.lines.map((l) => l.text))
  })

  test('words style names cells in words; coords style uses r3c4; both choose the same phrasings', () => {
    const steps = TECHNIQUES['hidden-single']
    const words = buildOutline(puzzle(), result(steps), { names: 'words' })
    const coords = buildOutline(puzzle(), result(steps), { names: 'coords' })
    expect(stepLines(words)[1].text).toContain('row 5, column 5')
    expect(stepLines(coords)[1].text).toContain('r5c5')
    expect(coords.lines.map((l) => l.text).join(' ')).not.toMatch(/row \d, column \d/)
    expect(coords.lines.map((l) => l.phrasing)).toEqual(words.lines.map((l) => l.phrasing))
  })

  test('houses are named naturally and digit lists are spoken ("3 or 8", "3 and 8")', () => {
    const o = buildOutline(puzzle(), result(TECHNIQUES['naked-pair'], 'stuck'))
    const all = o.lines.map((l) => l.text).join('\n')
    expect(all).toMatch(/column \d/)
    expect(all).toMatch(/3 or 8|3 and 8/)
    expect(all).not.toMatch(/\[3, ?8\]|3,8/)
    const locks = buildOutline(puzzle(), result(TECHNIQUES['locked-box-line'], 'stuck'))
    expect(locks.lines.map((l) => l.text).join('\n')).toMatch(/the (top|middle|central|bottom)-?\w* box/)
  })

  test('the first pair, locked-candidates, thermometer and contradiction lines explain the idea once', () => {
    for (const [technique, marker] of [
      ['naked-pair', "Here's a useful idea"],
      ['hidden-pair', "Here's a handy pattern"],
      ['locked-line-box', "This one's worth a moment"],
      ['thermo-length', 'Remember, digits go up strictly'],
      ['contradiction', 'Nothing simple is left'],
    ] as const) {
      const lines = stepLines(buildOutline(puzzle(), result(TECHNIQUES[technique], 'stuck')))
      expect(lines[0].text, technique).toContain(marker)
      expect(lines.filter((l) => l.text.includes(marker)), technique).toHaveLength(1)
      expect(lines[0].text.length).toBeGreaterThan(lines[1].text.length)
    }
  })

  test('a contradiction is told as a supposition that fails', () => {
    const lines = stepLines(buildOutline(puzzle(), result(TECHNIQUES.contradiction, 'stuck')))
    for (const l of lines) {
      expect(l.text).toMatch(/(Suppose|What if|Let's try)/)
      expect(l.text).toContain('row 9, column 1 would have nothing left')
      expect(l.text).toMatch(/(So it isn't an? \d|So no \d there|so the \d goes)\.$/)
    }
  })

  test('"That\'s the break-in." marks the first placement, and only it', () => {
    const steps = [...TECHNIQUES['thermo-length'].slice(0, 2), ...TECHNIQUES['naked-single'].slice(0, 5)]
    const o = buildOutline(puzzle(), result(steps))
    const marked = o.lines.filter((l) => l.text.includes('break-in'))
    expect(marked).toHaveLength(1)
    expect(marked[0].steps).toEqual([2])
  })

  test('intro states the standard rules, and the thermometer rule only when there are thermometers', () => {
    const withThermo = buildOutline(puzzle(), result(TECHNIQUES['naked-single']))
    expect(withThermo.lines[0].kind).toBe('intro')
    expect(withThermo.lines[0].text).toMatch(/row.*column.*box/s)
    expect(withThermo.lines[0].text).toMatch(/1 to 9/)
    expect(withThermo.lines[0].text).toMatch(/two thermometers/)
    expect(withThermo.lines[0].text).toMatch(/bulb/)
    const classic = buildOutline(puzzle({ thermometers: [] }), result(TECHNIQUES['naked-single']))
    expect(classic.lines[0].text).not.toMatch(/thermometer|bulb/)
  })

  test('outro credits the setter and the link, with placeholders when they are missing', () => {
    const o = buildOutline(puzzle(), result(TECHNIQUES['naked-single']), { link: 'https://example.com/p/1' })
    const outro = o.lines[o.lines.length - 1]
    expect(outro.kind).toBe('outro')
    expect(outro.text).toContain('Pat Setter')
    expect(outro.text).toContain('https://example.com/p/1')
    const bare = buildOutline(puzzle({ author: undefined }), result(TECHNIQUES['naked-single']))
    const bareOutro = bare.lines[bare.lines.length - 1].text
    expect(bareOutro).toContain('[setter]')
    expect(bareOutro).toContain('[puzzle link]')
  })
})
