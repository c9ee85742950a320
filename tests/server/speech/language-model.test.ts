/**
 * buildLanguageModel against the ARPA back-off format as CMU Sphinx and SRILM document it (from memory):
 * a \data\ header counting each order's entries, then per order "log10(p) w1 … wn [log10(backoff)]";
 * an unlisted n-gram's probability is its history's backoff weight times that of the n-gram one word shorter.
 * Under those rules every history's probabilities over the vocabulary must sum to 1.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { loadPronunciations } from '../../../server/speech/dictionary'
import { buildLanguageModel, FILLER_WORDS } from '../../../server/speech/language-model'
import { spokenWords } from '../../../shared/align/words'

const SCRIPT = [
  'Hello and welcome. This is a thermometer puzzle by Ada Wren, with three thermometers.',
  'There is only one place for a 7 in this box: r3c5.',
  'The bulb of that thermometer zorblat can’t be more than 4, so the tip is 6 or more.',
  'That finishes the top-left box: 2, 6 and 9.',
]

interface Arpa {
  declared: number[]
  grams: Map<string, { logProb: number; logBackoff: number }>[]
}

function parseArpa(text: string): Arpa {
  const lines = text.split('\n')
  expect(lines[0]).toBe('\\data\\')
  expect(lines.at(-2)).toBe('\\end\\')
  const declared: number[] = []
  const grams: Arpa['grams'] = []
  let order = 0
  for (const line of lines) {
    const count = /^ngram (\d+)=(\d+)$/.exec(line)
    if (count) declared[Number(count[1]) - 1] = Number(count[2])
    const section = /^\\(\d+)-grams:$/.exec(line)
    if (section) {
      order = Number(section[1])
      grams[order - 1] = new Map()
      continue
    }
    if (order === 0 || line === '' || line.startsWith('\\')) continue
    const fields = line.split(' ')
    expect(fields.length === order + 1 || fields.length === order + 2, line).toBe(true)
    grams[order - 1].set(fields.slice(1, order + 1).join(' '), { logProb: Number(fields[0]), logBackoff: Number(fields[order + 1] ?? 0) })
  }
  return { declared, grams }
}

/** P(word | history) under the ARPA back-off rules. */
function probability(arpa: Arpa, history: string[], word: string): number {
  const listed = arpa.grams[history.length]?.get([...history, word].join(' '))
  if (listed) return 10 ** listed.logProb
  if (history.length === 0) return 0
  const backoff = arpa.grams[history.length - 1].get(history.join(' '))?.logBackoff ?? 0
  return 10 ** backoff * probability(arpa, history.slice(1), word)
}

let dictionaryWords: Set<string>
beforeAll(async () => {
  dictionaryWords = new Set((await loadPronunciations()).keys())
})

describe('buildLanguageModel', () => {
  it('should write a well-formed ARPA model whose header counts its entries', () => {
    const arpa = parseArpa(buildLanguageModel(SCRIPT, dictionaryWords))
    expect(arpa.grams).toHaveLength(3)
    expect(arpa.declared).toEqual(arpa.grams.map((grams) => grams.size))
    for (const grams of arpa.grams) for (const { logProb } of grams.values()) expect(logProb).toBeLessThanOrEqual(0)
    // <s> only ever starts a sentence: listed as a history, never predicted
    expect(arpa.grams[0].get('<s>')?.logProb).toBe(-99)
  })

  it('should give every history a total probability of 1 over the vocabulary', () => {
    const arpa = parseArpa(buildLanguageModel(SCRIPT, dictionaryWords))
    const vocabulary = [...arpa.grams[0].keys()].filter((word) => word !== '<s>')
    const histories = [[], ...[...arpa.grams[0].keys()].filter((word) => word !== '</s>').map((word) => [word]), ...[...arpa.grams[1].keys()].map((gram) => gram.split(' '))]
    for (const history of histories) {
      const total = vocabulary.reduce((sum, word) => sum + probability(arpa, history, word), 0)
      expect(total, `after "${history.join(' ')}"`).toBeCloseTo(1, 3)
    }
  })

  it('should hold the take’s spoken words and the fillers, and leave out words the dictionary lacks', () => {
    const arpa = parseArpa(buildLanguageModel(SCRIPT, dictionaryWords))
    const unigrams = new Set(arpa.grams[0].keys())
    // digits and r3c4 are said as words
    for (const word of ['seven', 'row', 'three', 'column', 'five', 'thermometers', "can't"]) expect(unigrams).toContain(word)
    for (const filler of FILLER_WORDS.filter((word) => dictionaryWords.has(word))) expect(unigrams).toContain(filler)
    expect(dictionaryWords.has('zorblat')).toBe(false)
    expect(unigrams).not.toContain('zorblat')
    expect(arpa.grams[1].has('thermometer can\'t')).toBe(true)
    // each sentence of a line is bounded by <s> … </s>, so a pause after "welcome" starts afresh
    expect(arpa.grams[1].has('welcome </s>')).toBe(true)
    expect(arpa.grams[1].has('<s> this')).toBe(true)
    expect(spokenWords(SCRIPT.join(' ')).filter((word) => !unigrams.has(word))).toEqual(['zorblat'])
  })

  it('should smooth by Witten-Bell: a history trusts its own counts by c(h) / (c(h) + distinct followers)', () => {
    // Witten & Bell 1991, interpolated form as in Chen & Goodman 1998 §2.5 (from memory), worked by hand:
    // unigrams red 3, blue 2, green 1, </s> 3 over 9 tokens and 4 types: P(blue) = 9/13 · 2/9 + 4/13 · 1/4 = 3/13;
    // after "red": blue 2, green 1, so trust 3/5: P(blue | red) = 3/5 · 2/3 + 2/5 · 3/13;
    // after "<s> red" the same counts: P(blue | <s> red) = 3/5 · 2/3 + 2/5 · P(blue | red).
    const arpa = parseArpa(buildLanguageModel(['Red blue.', 'Red blue.', 'Red green.'], new Set(['red', 'blue', 'green'])))
    const bigram = (3 / 5) * (2 / 3) + (2 / 5) * (3 / 13)
    expect(probability(arpa, [], 'blue')).toBeCloseTo(3 / 13, 5)
    expect(probability(arpa, ['red'], 'blue')).toBeCloseTo(bigram, 5)
    expect(probability(arpa, ['<s>', 'red'], 'blue')).toBeCloseTo((3 / 5) * (2 / 3) + (2 / 5) * bigram, 5)
  })
})
