import { describe, expect, test } from 'vitest'
import { buildOutline, type Outline } from '../../../shared/script/index'
import { renderLine } from '../../../shared/script/narrate'
import type { Step } from '../../../shared/engine/types'
import {
  THERMO_A,
  THERMO_B,
  contradiction,
  fishStep,
  hiddenPair,
  hiddenSingle,
  locked,
  nakedPair,
  nakedSingle,
  puzzle,
  rc,
  result,
  thermoBounds,
  thermoEitherStep,
  thermoEndsStep,
  thermoLength,
  thermoPointingStep,
  wWingStep,
  wingStep,
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

// Row 4's 5 only in r4c7 and r4c8, three and two cells before r3c9 on THERMO_B: r3c9 is at least 7.
const POINTING_BEFORE = thermoPointingStep(5, { kind: 'row', index: 3 }, 'before', [[rc(4, 7), 3], [rc(4, 8), 2]], rc(3, 9))
// Column 9's 6 only in r4c9 and r3c9, two and three cells after r4c7: r4c7 is at most 4.
const POINTING_AFTER = thermoPointingStep(6, { kind: 'column', index: 8 }, 'after', [[rc(4, 9), 2], [rc(3, 9), 3]], rc(4, 7))
// Box 6's 5 in r4c8 (two before r3c9 on THERMO_B) or r6c9 (column 9 with r3c9): r3c9 is no 5.
const EITHER_OTHER = thermoEitherStep(5, { kind: 'box', index: 5 }, rc(3, 9), [
  { via: 'thermometer', cell: rc(4, 8), thermometer: 1, side: 'before', steps: 2 },
  { via: 'house', cell: rc(6, 9), house: { kind: 'column', index: 8 } },
], [5])
// Row 4's 5 in r4c8 or r4c9, r4c8 right before r4c9: r4c9 is 5 or more.
const EITHER_SELF = thermoEitherStep(5, { kind: 'row', index: 3 }, rc(4, 9), [
  { via: 'thermometer', cell: rc(4, 8), thermometer: 1, side: 'before', steps: 1 },
  { via: 'itself', cell: rc(4, 9) },
], [1, 2, 3, 4])
// Row 5's 8 in r5c2 or r5c8, each just before a tip (r4c2, r6c8); cells seeing both tips lose 9.
const ENDS_TIPS = thermoEndsStep(8, { kind: 'row', index: 4 }, 'tip', [[rc(5, 2), 2, rc(4, 2)], [rc(5, 8), 3, rc(6, 8)]], [rc(4, 8), rc(6, 2)])
// Column 5's 2 in r2c5 or r8c5, each just after a bulb (r2c4, r8c6); cells seeing both bulbs lose 1.
const ENDS_BULBS = thermoEndsStep(2, { kind: 'column', index: 4 }, 'bulb', [[rc(2, 5), 2, rc(2, 4)], [rc(8, 5), 3, rc(8, 6)]], [rc(2, 6), rc(8, 4)])

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
  'x-wing': [0, 1, 2, 3, 4, 5].map((i) => fishStep(4, [2, 7], [1 + i, 8], [rc(4, 1 + i)])),
  swordfish: [0, 1, 2, 3, 4, 5].map((i) => fishStep(6, [1, 5, 8], [1 + i, 7, 9], [rc(3, 7)])),
  'xy-wing': [0, 1, 2, 3, 4, 5].map((i) => wingStep('xy', rc(1, 8), [1, 2, 9], [rc(1, 1 + i), rc(4, 8)], [rc(4, 1 + i)])),
  'xyz-wing': [0, 1, 2, 3, 4, 5].map((i) => wingStep('xyz', rc(4, 2), [2, 1, 5], [rc(4, 4 + i % 3), rc(6, 2)], [rc(4, 3)])),
  'w-wing': [0, 1, 2, 3, 4, 5].map((i) => wWingStep([rc(1, 3), rc(2, 7 + (i % 3))], [4, 2], { kind: 'row', index: 3 }, [rc(4, 3), rc(4, 7 + (i % 3))], [rc(1, 8)])),
  // thermometer and house: the positions of tests/shared/engine/thermo-patterns.test.ts, moved onto THERMO_B where they need a thermometer
  'thermo-pointing': [0, 1, 2, 3, 4, 5].map((i) => (i % 2 ? POINTING_AFTER : POINTING_BEFORE)),
  'thermo-either': [
    EITHER_OTHER,
    EITHER_SELF,
    thermoEitherStep(4, { kind: 'box', index: 5 }, rc(3, 9), [
      { via: 'thermometer', cell: rc(4, 7), thermometer: 1, side: 'before', steps: 3 },
      { via: 'house', cell: rc(5, 9), house: { kind: 'column', index: 8 } },
    ], [4]),
    thermoEitherStep(5, { kind: 'row', index: 3 }, rc(4, 8), [
      { via: 'thermometer', cell: rc(4, 7), thermometer: 1, side: 'before', steps: 1 },
      { via: 'itself', cell: rc(4, 8) },
    ], [1, 2, 3, 4]),
    thermoEitherStep(6, { kind: 'box', index: 5 }, rc(3, 9), [
      { via: 'thermometer', cell: rc(4, 8), thermometer: 1, side: 'before', steps: 2 },
      { via: 'house', cell: rc(5, 9), house: { kind: 'column', index: 8 } },
    ], [6]),
    thermoEitherStep(7, { kind: 'column', index: 8 }, rc(3, 9), [
      { via: 'itself', cell: rc(3, 9) },
      { via: 'thermometer', cell: rc(4, 9), thermometer: 1, side: 'before', steps: 1 },
    ], [1, 2, 3, 4, 5, 6]),
  ],
  'thermo-ends': [0, 1, 2, 3, 4, 5].map((i) => (i % 2 ? ENDS_BULBS : ENDS_TIPS)),
}

describe('buildOutline narration', () => {
  // thermometer lengths in a row are said together in one line (tested with the folding below)
  for (const [technique, steps] of Object.entries(TECHNIQUES).filter(([t]) => t !== 'thermo-length')) {
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
      // lengths one after another share a line, so each one here follows a pair
      const steps = technique === 'thermo-length' ? TECHNIQUES[technique].flatMap((s, i) => [s, TECHNIQUES['naked-pair'][i]]).slice(0, -1) : TECHNIQUES[technique]
      const lines = stepLines(buildOutline(puzzle(), result(steps, 'stuck'))).filter((l) => l.steps.every((k) => steps[k].technique === technique))
      expect(lines[0].text, technique).toContain(marker)
      expect(lines.filter((l) => l.text.includes(marker)), technique).toHaveLength(1)
      expect(lines[0].text.length).toBeGreaterThan(lines[1].text.length)
    }
  })

  test('thermometer-and-house lines name the digit, its places, the cell and the true bound in every phrasing', () => {
    const said = (step: Step) => [0, 1, 2].map((p) => {
      const o = buildOutline(puzzle(), result([step], 'stuck'))
      const line = stepLines(o)[0]
      return renderLine({ ...o, steps: [step] }, line, p)
    })
    for (const text of said(POINTING_BEFORE)) {
      expect(text).toMatch(/columns 7 and 8|column 7 or 8/)
      expect(text).not.toMatch(/row 4, row 4/)
      expect(text).toContain('row 3, column 9')
      expect(text).toContain('at least 7')
      expect(text).toContain('two cells nearer the bulb')
      expect(text).toContain('That takes 1, 2, 3, 4, 5 and 6 out of row 3, column 9.')
    }
    for (const text of said(POINTING_AFTER)) expect(text).toMatch(/at most 4/)
    for (const text of said(EITHER_OTHER)) {
      expect(text).toContain('column 9') // the house r6c9 shares with r3c9
      expect(text).toContain('two cells after it') // r3c9 seen from r4c8 on the thermometer
      expect(text).toContain('at least 7')
      expect(text).toMatch(/can't be 5|loses 5|rule out 5/)
    }
    for (const text of said(EITHER_SELF)) {
      expect(text).toMatch(/itself|isn't row 4, column 9|takes it/)
      expect(text).toMatch(/5 or more|more than 5/)
      expect(text).toMatch(/1, 2, 3 or 4|1, 2, 3 and 4/)
    }
    for (const text of said(ENDS_TIPS)) {
      expect(text).toMatch(/columns 2 and 8|column 2 or 8/)
      expect(text).toMatch(/9/)
      expect(text).toMatch(/tip/)
      expect(text).toContain('That takes 9 out of row 4, column 8 and row 6, column 2.')
    }
    for (const text of said(ENDS_BULBS)) {
      expect(text).toMatch(/bulb/)
      expect(text).toMatch(/a 1\b/)
    }
  })

  test('a contradiction is told as a supposition that fails', () => {
    const lines = stepLines(buildOutline(puzzle(), result(TECHNIQUES.contradiction, 'stuck')))
    for (const l of lines) {
      expect(l.text).toMatch(/(Suppose|What if|Let's try)/i)
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

describe('fish and wing lines name what the deduction really uses (trade facts, from memory)', () => {
  const said = (steps: Step[]) => stepLines(buildOutline(puzzle(), result(steps, 'stuck'), { names: 'coords' })).map((l) => l.text)

  test('an X-wing or swordfish line names the digit, its base rows and cover columns, and what goes', () => {
    for (const text of said(TECHNIQUES['x-wing'])) {
      expect(text).toMatch(/rows 2 and 7/)
      expect(text).toMatch(/columns \d and 8/)
      expect(text).toMatch(/\b4s?\b/)
      expect(text).toMatch(/That takes 4 out of r4c\d\./)
    }
    for (const text of said(TECHNIQUES.swordfish)) expect(text).toMatch(/rows 1, 5 and 8.*columns \d, 7 and 9/)
    expect(said(TECHNIQUES['x-wing'])[0]).toContain('Time for a bigger pattern')
  })

  test('an XY-wing line names the pivot, both pincers with their digits, and the digit one of them must hold', () => {
    for (const text of said(TECHNIQUES['xy-wing'])) {
      expect(text).toContain('r1c8')
      expect(text).toMatch(/r1c\d/)
      expect(text).toContain('r4c8')
      expect(text).toMatch(/\b1\b.*\b2\b/)
      expect(text).toMatch(/9/)
    }
  })

  test('an XYZ-wing line says the pivot can itself be the shared digit', () => {
    for (const text of said(TECHNIQUES['xyz-wing'])) {
      expect(text).toContain('r4c2')
      expect(text).toContain('r6c2')
      for (const d of [1, 2, 5]) expect(text).toMatch(new RegExp(`\\b${d}\\b`))
      expect(text).toMatch(/(the|a) 5 itself/)
    }
  })

  test('a W-wing line names both cells, the house, the linking digit and its two places', () => {
    for (const text of said(TECHNIQUES['w-wing'])) {
      expect(text).toContain('r1c3')
      expect(text).toMatch(/r2c[789]/)
      expect(text).toMatch(/row 4/i)
      expect(text).toContain('r4c3')
      expect(text).toMatch(/4 or 2/)
      expect(text).toMatch(/That takes 4 out of r1c8\./)
    }
  })
})

// Provenance (issue #12 §3): a single whose blockers are earlier steps says those steps' reasons.
// Hand-built steps (constructed): a naked pair on 3 and 8 in row 4 first, then singles that rely on it.
describe('singles told by the steps that ruled their digits out', () => {
  const pair = nakedPair({ kind: 'row', index: 3 }, [rc(4, 1), rc(4, 2)], [3, 8], [rc(4, 5)])
  const cell = rc(4, 5)
  const base = nakedSingle(cell)
  const others = [1, 2, 3, 4, 5, 6, 7, 8, 9].filter((d) => d !== base.placements[0].digit)
  const gone = others.filter((d) => d === 3 || d === 8)
  const kept = others.filter((d) => d !== 3 && d !== 8)
  const single: Step = {
    ...base,
    facts: {
      kind: 'single-cell',
      cell,
      digit: base.placements[0].digit,
      seen: { row: [], column: kept, box: [], ruledOut: gone },
      ruledOutBy: gone.map((digit) => ({ digit, step: 0 })),
    },
  }

  test('a last-candidate single names the pair in row 4, and never "its row, column and box"', () => {
    for (let phrasing = 0; phrasing < 4; phrasing++) {
      const text = renderLine(buildOutline(puzzle(), result([pair, single]), { names: 'coords' }), { kind: 'step', steps: [1] }, phrasing)
      expect(text).toMatch(/ruled out earlier with the pair in row 4/)
      expect(text).not.toMatch(/row, column and box/)
      expect(text).toMatch(/its column/i)
    }
  })

  test('a hidden single names the placed digit\'s house and the step that took the digit out of a cell', () => {
    const house = { kind: 'row' as const, index: 3 }
    const hidden = hiddenSingle(rc(4, 9), 'row', 0)
    const digit = hidden.placements[0].digit
    const told: Step = {
      ...hidden,
      facts: { kind: 'single-house', cell: rc(4, 9), digit, house, blockedCells: [rc(4, 5), rc(4, 6)], blockers: [{ cell: rc(4, 5), step: 0 }, { cell: rc(4, 6), peer: rc(1, 6) }] },
    }
    for (let phrasing = 0; phrasing < 4; phrasing++) {
      const text = renderLine(buildOutline(puzzle(), result([pair, told]), { names: 'coords' }), { kind: 'step', steps: [1] }, phrasing)
      expect(text).toMatch(/the pair in row 4 took it out of r4c5/)
      expect(text).toMatch(/Column 6 already has an? \d/)
    }
  })

  test('a long what-if warns that it is long, and reads every link (none counted away)', () => {
    const step = contradiction(rc(1, 1), 2, rc(9, 1))
    const facts = step.facts
    if (facts.kind !== 'contradiction') throw new Error('not a contradiction')
    const chain = Array.from({ length: 8 }, (_, i) => ({ ...facts.chain[0], cell: rc(5, 1 + i) }))
    const long: Step = { ...step, facts: { ...facts, chain, long: true } }
    const o = buildOutline(puzzle(), result([long], 'stuck'), { names: 'coords' })
    const texts = [0, 1, 2].map((p) => renderLine(o, { kind: 'step', steps: [0] }, p))
    for (const t of texts) expect(t).toMatch(/long|longer/)
    for (const t of texts) for (const link of chain) expect(t).toContain(`r5c${(link.cell % 9) + 1}`)
    for (const t of texts) expect(t).not.toMatch(/steps later/)
  })
})
