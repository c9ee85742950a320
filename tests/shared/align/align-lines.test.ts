/**
 * The matcher on hand-made heard words: each case is a presenter habit (paraphrase, skipped line, clauses said
 * in another order, chatter, numbers said rather than written, words the recogniser lost). Speech is laid out at a
 * steady 160 words a minute (375 ms a word, a common narration pace) with the pauses each case names.
 */
import fc from 'fast-check'
import { describe, expect, test } from 'vitest'
import { alignLines } from '../../../shared/align/index'
import type { TimedWord } from '../../../shared/align/types'

const MS_PER_WORD = 375

const LINES = [
  { lineId: 1, text: 'Hello and welcome, today we have a thermometer puzzle from a setter called Marla Quince.' },
  { lineId: 2, text: "There's just one home for a 3 in this box, and it's the cell at r3c5." },
  { lineId: 3, text: 'The bottom-middle box still needs a 6, and only one cell can take it.' },
  { lineId: 4, text: 'Because each cell on a thermometer must beat the one before it, the bulb is at most 7.' },
  { lineId: 5, text: 'Count the cells on the long thermometer: five, so its tip starts at 5.' },
  { lineId: 6, text: 'A few quick ones in the top-left box now: 8 and 2.' },
  { lineId: 7, text: 'And that finishes the puzzle. Thanks for watching, see you next time!' },
]

/** Heard words for utterances said one after another, each after its pause; returns the words and each start. */
function speech(utterances: { text: string; pauseMs: number }[]): { words: TimedWord[]; starts: number[] } {
  const words: TimedWord[] = []
  const starts: number[] = []
  let t = 0
  for (const u of utterances) {
    t += u.pauseMs
    starts.push(t)
    for (const word of u.text.split(/\s+/).filter(Boolean)) {
      words.push({ word, startMs: t, endMs: t + MS_PER_WORD - 60 })
      t += MS_PER_WORD
    }
  }
  return { words, starts }
}

function startsById(result: ReturnType<typeof alignLines>): Map<number, number> {
  return new Map(result.proposals.map((p) => [p.lineId, p.startMs]))
}

describe('alignLines', () => {
  test('lines said as written => every line placed at its first word, confidence 1', () => {
    const { words, starts } = speech(LINES.map((l) => ({ text: l.text, pauseMs: 800 })))
    const result = alignLines(LINES, words)
    expect(result.unplaced).toEqual([])
    expect(result.proposals.map((p) => p.startMs)).toEqual(starts)
    expect(result.proposals.every((p) => p.confidence === 1)).toBe(true)
  })

  test('paraphrase (synonyms, filler, an aside) => still placed, within a word of the true start, confidence below 1', () => {
    const said = [
      LINES[0].text,
      "Okay so there's only one place for a three in this box, and it's the square at row three column five.",
      'The bottom middle box still wants a six, you know, and just one cell is able to take it.',
      LINES[3].text,
    ]
    const { words, starts } = speech(said.map((text) => ({ text, pauseMs: 1000 })))
    const result = alignLines(LINES.slice(0, 4), words)
    expect(result.unplaced).toEqual([])
    const got = startsById(result)
    LINES.slice(0, 4).forEach((l, i) => expect(Math.abs(got.get(l.lineId)! - starts[i])).toBeLessThanOrEqual(MS_PER_WORD))
    expect(result.proposals[2].confidence).toBeLessThan(1)
  })

  test('a line left out => reported unplaced, never guessed, and the lines around it still placed', () => {
    const said = LINES.filter((l) => l.lineId !== 4)
    const { words, starts } = speech(said.map((l) => ({ text: l.text, pauseMs: 900 })))
    const result = alignLines(LINES, words)
    expect(result.unplaced).toEqual([4])
    expect(result.proposals.map((p) => p.lineId)).toEqual([1, 2, 3, 5, 6, 7])
    expect(result.proposals.map((p) => p.startMs)).toEqual(starts)
  })

  test('clauses said in the other order => the line starts where its first spoken clause starts', () => {
    const said = [
      LINES[2].text,
      'The bulb is at most seven, because each cell on a thermometer must beat the one before it.',
      LINES[4].text,
    ]
    const { words, starts } = speech(said.map((text) => ({ text, pauseMs: 1200 })))
    const result = alignLines(LINES.slice(2, 5), words)
    expect(result.unplaced).toEqual([])
    expect(startsById(result).get(4)).toBe(starts[1])
  })

  test('chatter between lines => each line starts at its own first word, not at the chatter', () => {
    const { words, starts } = speech([
      { text: LINES[4].text, pauseMs: 500 },
      { text: 'Let me grab a sip of tea, my cat is on the desk again.', pauseMs: 2500 },
      { text: LINES[5].text, pauseMs: 400 },
      { text: LINES[6].text, pauseMs: 3000 },
    ])
    const result = alignLines(LINES.slice(4), words)
    expect(result.proposals.map((p) => p.startMs)).toEqual([starts[0], starts[2], starts[3]])
  })

  test('numbers as digits in the script and as words in the speech (and the other way round) => matched', () => {
    const lines = [
      { lineId: 1, text: 'So r7c2 has to be a 9.' },
      { lineId: 2, text: 'That leaves three and eight for row four.' },
    ]
    const { words, starts } = speech([
      { text: 'so row seven column two has to be a nine', pauseMs: 300 },
      { text: 'that leaves 3 and 8 for row 4', pauseMs: 900 },
    ])
    const result = alignLines(lines, words)
    expect(result.proposals.map((p) => [p.lineId, p.startMs, p.confidence])).toEqual([[1, starts[0], 1], [2, starts[1], 1]])
  })

  test('the recogniser lost a line\'s first words => the start moves back by the speaking rate, not to the first word heard', () => {
    const full = speech(LINES.slice(0, 3).map((l) => ({ text: l.text, pauseMs: 1500 })))
    // the first three words of line 3 ("The bottom-middle box" → four spoken words) were not recognised
    const lineThreeFirst = full.words.findIndex((w) => w.startMs === full.starts[2])
    const words = full.words.filter((_, i) => i < lineThreeFirst || i >= lineThreeFirst + 4)
    const got = startsById(alignLines(LINES.slice(0, 3), words)).get(3)!
    expect(Math.abs(got - full.starts[2])).toBeLessThanOrEqual(2 * MS_PER_WORD)
  })

  test('nothing heard, or heard words about something else => every line unplaced', () => {
    expect(alignLines(LINES, [])).toEqual({ proposals: [], unplaced: [1, 2, 3, 4, 5, 6, 7] })
    const { words } = speech([{ text: 'the weather today is cloudy with a chance of rain later in the evening', pauseMs: 0 }])
    expect(alignLines(LINES, words).unplaced).toEqual([1, 2, 3, 4, 5, 6, 7])
  })

  test('any presenter: dropped lines, chatter and pauses of 0.5–6 s => starts ascend, placed lines within 1 s, left-out lines unplaced', () => {
    const chatter = ['Let me just have a quick sip of tea.', 'Hang on, I lost my place for a second.', 'My cat has walked across the desk again.']
    fc.assert(
      fc.property(
        fc.array(fc.record({ said: fc.boolean(), chatter: fc.option(fc.constantFrom(...chatter)), pauseMs: fc.integer({ min: 500, max: 6000 }) }), {
          minLength: LINES.length,
          maxLength: LINES.length,
        }),
        (plan) => {
          const utterances: { text: string; pauseMs: number; lineId?: number }[] = []
          plan.forEach((p, i) => {
            if (p.chatter) utterances.push({ text: p.chatter, pauseMs: p.pauseMs })
            if (p.said || i === 0) utterances.push({ text: LINES[i].text, pauseMs: p.pauseMs, lineId: LINES[i].lineId })
          })
          const { words, starts } = speech(utterances)
          const truth = new Map(utterances.flatMap((u, k) => (u.lineId ? [[u.lineId, starts[k]] as const] : [])))
          const result = alignLines(LINES, words)
          const got = result.proposals.map((p) => p.startMs)
          expect(got).toEqual([...got].sort((a, b) => a - b))
          for (const p of result.proposals) expect(Math.abs(p.startMs - truth.get(p.lineId)!)).toBeLessThanOrEqual(1000)
          for (const l of LINES) if (!truth.has(l.lineId)) expect(result.unplaced).toContain(l.lineId)
          expect(result.proposals.length + result.unplaced.length).toBe(LINES.length)
        },
      ),
      { numRuns: 200 },
    )
  })
})
