import { spokenWords } from '../../shared/align/words'

/**
 * Words presenters add to a script when they speak it. Each gets a small share of the unigram mass,
 * so the recogniser can hear an ad-lib as itself instead of forcing a script word onto it.
 */
export const FILLER_WORDS = ['so', 'okay', 'now', 'right', 'um', 'uh', 'well', 'and', 'yeah']

// share of unigram mass kept for the filler words, whether or not the script uses them
const FILLER_SHARE = 0.03
const ORDER = 3
const SENTENCE_START = '<s>'
const SENTENCE_END = '</s>'

/**
 * A text ARPA language model (the format pocketsphinx and SRILM read) made from the take's own lines:
 * unigrams, bigrams and trigrams of the spoken words, each line and each sentence in it bounded by
 * <s> … </s>. Smoothing is interpolated Witten-Bell: a history's own counts are trusted by
 * c(h) / (c(h) + T(h)), T(h) being how many different words followed it, and the rest of its mass
 * comes from the next shorter history; written in backoff form as SRILM writes interpolated models
 * (each listed probability is already interpolated; the backoff weight makes every history sum to 1).
 * Words the dictionary lacks are left out, as the recogniser could never produce them.
 */
export function buildLanguageModel(scriptTexts: string[], dictionaryWords: Set<string>): string {
  const sentences = scriptTexts.flatMap(sentencesOf).map((words) => words.filter((word) => dictionaryWords.has(word))).filter((words) => words.length > 0)
  const fillers = FILLER_WORDS.filter((word) => dictionaryWords.has(word))
  const counts = countNgrams(sentences)
  const vocabulary = new Set([...sentences.flat(), ...fillers, SENTENCE_END])
  const model = smooth(counts, vocabulary, fillers)
  return toArpa(model)
}

/** Split at sentence ends first: a presenter pauses there, so the recogniser starts a fresh utterance. */
function sentencesOf(text: string): string[][] {
  return text.split(/(?<=[.!?;:])\s+/).map(spokenWords)
}

type Counts = Map<string, number>[] // by order - 1: "w1 w2 … wn" → count

function countNgrams(sentences: string[][]): Counts {
  const counts: Counts = Array.from({ length: ORDER }, () => new Map())
  for (const sentence of sentences) {
    const tokens = [SENTENCE_START, ...sentence, SENTENCE_END]
    for (let end = 1; end < tokens.length; end++) {
      for (let n = 1; n <= ORDER && end - n + 1 >= 0; n++) {
        const gram = tokens.slice(end - n + 1, end + 1)
        // <s> is only ever a history: it is never predicted, so it has no unigram count
        if (gram[0] === SENTENCE_START && n === 1) continue
        const key = gram.join(' ')
        counts[n - 1].set(key, (counts[n - 1].get(key) ?? 0) + 1)
      }
    }
  }
  return counts
}

interface Model {
  /** log10 probability of each listed n-gram, by order - 1 */
  logProbs: Map<string, number>[]
  /** log10 backoff weight of each history that has longer n-grams */
  logBackoffs: Map<string, number>
}

function smooth(counts: Counts, vocabulary: Set<string>, fillers: string[]): Model {
  const unigram = unigramProbabilities(counts[0], vocabulary, fillers)
  // prob(words) for any n-gram, with backoff for unlisted ones: what each higher order interpolates with
  const probs: Map<string, number>[] = [unigram]
  const backoffs = new Map<string, number>()
  const backedOff = (gram: string[]): number => {
    const listed = probs[gram.length - 1]?.get(gram.join(' '))
    if (listed !== undefined) return listed
    return (backoffs.get(gram.slice(0, -1).join(' ')) ?? 1) * backedOff(gram.slice(1))
  }
  for (let order = 2; order <= ORDER; order++) {
    const byHistory = groupByHistory(counts[order - 1])
    const listed = new Map<string, number>()
    for (const [history, followers] of byHistory) {
      const total = sum(followers.values())
      const trust = total / (total + followers.size)
      const historyWords = history.split(' ')
      let mass = 0
      let lowerMass = 0
      for (const [word, count] of followers) {
        const lower = backedOff([...historyWords.slice(1), word])
        const prob = trust * (count / total) + (1 - trust) * lower
        listed.set(`${history} ${word}`, prob)
        mass += prob
        lowerMass += lower
      }
      // the mass left for unlisted words, spread as the shorter history spreads it
      backoffs.set(history, lowerMass < 1 - 1e-12 ? (1 - mass) / (1 - lowerMass) : 1)
    }
    probs.push(listed)
  }
  // <s> is listed among the unigrams (with no probability of its own) because it is a history
  probs[0].set(SENTENCE_START, 0)
  return {
    logProbs: probs.map((byGram) => new Map([...byGram].map(([gram, prob]) => [gram, prob > 0 ? Math.log10(prob) : -99]))),
    logBackoffs: new Map([...backoffs].map(([history, weight]) => [history, Math.log10(weight)])),
  }
}

function unigramProbabilities(counts: Map<string, number>, vocabulary: Set<string>, fillers: string[]): Map<string, number> {
  const total = sum(counts.values())
  const trust = total / (total + counts.size)
  const fillerShare = fillers.length > 0 ? FILLER_SHARE : 0
  const probs = new Map<string, number>()
  for (const word of vocabulary) {
    const scriptProb = trust * ((counts.get(word) ?? 0) / total) + (1 - trust) / vocabulary.size
    probs.set(word, (1 - fillerShare) * scriptProb + (fillers.includes(word) ? fillerShare / fillers.length : 0))
  }
  return probs
}

function groupByHistory(grams: Map<string, number>): Map<string, Map<string, number>> {
  const byHistory = new Map<string, Map<string, number>>()
  for (const [gram, count] of grams) {
    const cut = gram.lastIndexOf(' ')
    const history = gram.slice(0, cut)
    if (!byHistory.has(history)) byHistory.set(history, new Map())
    byHistory.get(history)?.set(gram.slice(cut + 1), count)
  }
  return byHistory
}

function toArpa({ logProbs, logBackoffs }: Model): string {
  const out = ['\\data\\', ...logProbs.map((grams, i) => `ngram ${i + 1}=${grams.size}`), '']
  logProbs.forEach((grams, i) => {
    out.push(`\\${i + 1}-grams:`)
    for (const [gram, logProb] of grams) {
      const backoff = logBackoffs.get(gram)
      out.push(backoff === undefined ? `${logProb.toFixed(6)} ${gram}` : `${logProb.toFixed(6)} ${gram} ${backoff.toFixed(6)}`)
    }
    out.push('')
  })
  out.push('\\end\\', '')
  return out.join('\n')
}

const sum = (values: Iterable<number>) => {
  let total = 0
  for (const value of values) total += value
  return total
}
