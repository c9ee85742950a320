/**
 * Order-preserving alignment of two word sequences (script words against heard words).
 * A full dynamic-programming match is the most accurate but costs |script|·|heard| cells, so long inputs are first
 * cut at anchors — word runs that occur exactly once on both sides, kept only when they agree in order (longest
 * increasing subsequence) — and each stretch between anchors is matched in full.
 */
import type { Vocabulary } from './similarity'

/** Script word `s` was heard as heard word `r`, this alike. */
export interface WordPair {
  s: number
  r: number
  similarity: number
}

/** Largest stretch matched cell by cell (one byte each for the way back). */
const FULL_MATCH_CELLS = 4_000_000
const ANCHOR_LENGTHS = [4, 3, 2]

/** Pairs in ascending order of both `s` and `r`, maximising the summed weight × similarity of matched words. */
export function alignSequences(script: number[], heard: number[], weights: Float64Array, vocabulary: Vocabulary): WordPair[] {
  const pairs: WordPair[] = []
  const aligner = { script, heard, weights, similarity: similarityTable(script, heard, vocabulary), pairs }
  alignStretch(aligner, 0, script.length, 0, heard.length)
  return pairs
}

interface Aligner {
  script: number[]
  heard: number[]
  weights: Float64Array
  similarity: (scriptWord: number, heardWord: number) => number
  pairs: WordPair[]
}

/**
 * A dense table filled on first use: the full match asks about the same pairs of words millions of times.
 * Similarities are kept in hundredths, one byte each, so an hour of words against a long script stays small.
 */
function similarityTable(script: number[], heard: number[], vocabulary: Vocabulary) {
  const rows = largest(script) + 1
  const columns = largest(heard) + 1
  const known = new Int8Array(rows * columns).fill(-1)
  return (s: number, r: number): number => {
    const at = s * columns + r
    let hundredths = known[at]
    if (hundredths < 0) {
      hundredths = Math.round(vocabulary.similarity(s, r) * 100)
      known[at] = hundredths
    }
    return hundredths / 100
  }
}

function largest(ids: number[]): number {
  let max = 0
  for (const id of ids) if (id > max) max = id
  return max
}

function alignStretch(a: Aligner, s0: number, s1: number, r0: number, r1: number): void {
  if (s1 <= s0 || r1 <= r0) return
  if ((s1 - s0) * (r1 - r0) <= FULL_MATCH_CELLS) {
    matchInFull(a, s0, s1, r0, r1)
    return
  }
  for (const n of ANCHOR_LENGTHS) {
    const anchors = orderedAnchors(a, s0, s1, r0, r1, n)
    if (anchors.length === 0) continue
    let s = s0
    let r = r0
    for (const [as, ar] of anchors) {
      alignStretch(a, s, as, r, ar)
      a.pairs.push({ s: as, r: ar, similarity: 1 })
      s = as + 1
      r = ar + 1
    }
    alignStretch(a, s, s1, r, r1)
    return
  }
  // Nothing in common that is long enough to trust, and too large to match word by word: such a stretch
  // (a script far longer than what was said, or a recording of something else) is left unmatched.
}

/** Starts of n-word runs found exactly once in each stretch, as [s, r], thinned to the longest run ascending in both. */
function orderedAnchors(a: Aligner, s0: number, s1: number, r0: number, r1: number, n: number): [number, number][] {
  const inScript = uniqueRuns(a.script, s0, s1, n)
  const inHeard = uniqueRuns(a.heard, r0, r1, n)
  const candidates: [number, number][] = []
  for (const [key, s] of inScript) {
    const r = inHeard.get(key)
    if (r !== undefined) candidates.push([s, r])
  }
  candidates.sort((x, y) => x[0] - y[0])
  return longestAscending(candidates)
}

function uniqueRuns(words: number[], from: number, to: number, n: number): Map<string, number> {
  const seen = new Map<string, number>()
  for (let i = from; i + n <= to; i++) {
    const key = runKey(words, i, n)
    seen.set(key, seen.has(key) ? -1 : i)
  }
  for (const [key, i] of seen) if (i < 0) seen.delete(key)
  return seen
}

/** A run's words as a short string: one UTF-16 unit per word while ids fit in one, which they do below 65,536 words. */
function runKey(words: number[], at: number, n: number): string {
  let key = ''
  for (let i = at; i < at + n; i++) key += words[i] < 0xffff ? String.fromCharCode(words[i]) : `\uffff${words[i]},`
  return key
}

/** Longest subsequence ascending in the second member (the first already ascends), by patience sorting. */
function longestAscending(items: [number, number][]): [number, number][] {
  const tails: number[] = []
  const previous = new Int32Array(items.length).fill(-1)
  items.forEach(([, r], i) => {
    let lo = 0
    let hi = tails.length
    while (lo < hi) {
      const mid = (lo + hi) >> 1
      if (items[tails[mid]][1] < r) lo = mid + 1
      else hi = mid
    }
    if (lo > 0) previous[i] = tails[lo - 1]
    tails[lo] = i
  })
  const out: [number, number][] = []
  for (let i = tails.length ? tails[tails.length - 1] : -1; i >= 0; i = previous[i]) out.push(items[i])
  return out.reverse()
}

const FROM_DIAGONAL = 1
const FROM_ABOVE = 2

/** Weighted longest common subsequence over one stretch, with near-miss words counting by their similarity. */
function matchInFull(a: Aligner, s0: number, s1: number, r0: number, r1: number): void {
  const rows = s1 - s0
  const cols = r1 - r0
  const way = new Uint8Array(rows * cols)
  let above = new Float64Array(cols + 1)
  let current = new Float64Array(cols + 1)
  for (let i = 0; i < rows; i++) {
    const word = a.script[s0 + i]
    const weight = a.weights[s0 + i]
    current[0] = 0
    for (let j = 0; j < cols; j++) {
      const similarity = a.similarity(word, a.heard[r0 + j])
      let best = current[j]
      let from = 0
      if (above[j + 1] > best) {
        best = above[j + 1]
        from = FROM_ABOVE
      }
      // on a tie the match wins: a line then takes the copy of a common word said with it, not one said before it
      if (similarity > 0 && above[j] + weight * similarity >= best) {
        best = above[j] + weight * similarity
        from = FROM_DIAGONAL
      }
      current[j + 1] = best
      way[i * cols + j] = from
    }
    ;[above, current] = [current, above]
  }
  const found: WordPair[] = []
  let i = rows - 1
  let j = cols - 1
  while (i >= 0 && j >= 0) {
    const from = way[i * cols + j]
    if (from === FROM_DIAGONAL) {
      found.push({ s: s0 + i, r: r0 + j, similarity: a.similarity(a.script[s0 + i], a.heard[r0 + j]) })
      i--
      j--
    } else if (from === FROM_ABOVE) i--
    else j--
  }
  for (let k = found.length - 1; k >= 0; k--) a.pairs.push(found[k])
}
