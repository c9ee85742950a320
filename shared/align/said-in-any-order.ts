/**
 * Where a line was said when its clauses came out in another order: the run of heard words, between two limits,
 * that holds most of the line's words in any order. Each heard word scores its line word's weight when it is one,
 * and costs a little when it is not, so chatter breaks a run and a short aside inside the line doesn't. A run is
 * never longer than the line could take to say, and never spans a long pause — without those limits the common
 * words a line shares with its neighbours ("row", "the", digits) would pull their speech in too.
 */
import type { Vocabulary } from './similarity'

export interface AnyOrderRun {
  /** heard word indices, inclusive */
  first: number
  last: number
  /** matched share of the line's weight, each line word counted once */
  covered: number
}

const SAME_WORD = 0.8
const STRANGER_COST = 0.35

/** The best run of heard words in (after, before) for a line; null when none holds any of its words. */
export function saidInAnyOrder(
  line: { ids: number[]; weights: number[] },
  heard: { ids: number[]; startMs: Float64Array; endMs: Float64Array },
  limits: { after: number; before: number; longestRun: number; longestPauseMs: number },
  vocabulary: Vocabulary,
): AnyOrderRun | null {
  const kinds = new Map<number, number>()
  line.ids.forEach((id, i) => kinds.set(id, Math.max(kinds.get(id) ?? 0, line.weights[i])))
  // Best run ending at each word: its sum less the smallest prefix sum among the allowed starts (a rising deque).
  const prefix: number[] = [0]
  const starts: number[] = []
  let earliest = limits.after + 1
  let best: { first: number; last: number; score: number } | null = null
  for (let j = limits.after + 1; j < limits.before; j++) {
    if (j > earliest && heard.startMs[j] - heard.endMs[j - 1] >= limits.longestPauseMs) {
      earliest = j
      starts.length = 0
    }
    const at = j - limits.after - 1
    while (starts.length > 0 && prefix[starts[starts.length - 1]] >= prefix[at]) starts.pop()
    starts.push(at)
    while (starts[0] < at + 1 - limits.longestRun) starts.shift()
    const score = scoreOf(heard.ids[j], kinds, vocabulary)
    prefix.push(prefix[at] + score)
    const from = starts[0]
    const runScore = prefix[at + 1] - prefix[from]
    if (score > 0 && (!best || runScore > best.score)) best = { first: from + limits.after + 1, last: j, score: runScore }
  }
  if (!best) return null
  // Trim both ends to the line's own words: a run ends where the line's words run out going forward, and starts
  // where they run out going back from that end.
  const last = furthestOwnWord(line.ids, heard.ids, best.first, best.last, vocabulary)
  const first = furthestOwnWord(line.ids, heard.ids, last, best.first, vocabulary)
  return { first, last, covered: coverage(line, heard.ids.slice(first, last + 1), vocabulary) }
}

/**
 * Walking from heard word `from` to `to` (either way), the furthest one that is a line word not yet used up —
 * not a stranger, nor a second copy of a word the line says once.
 */
function furthestOwnWord(lineIds: number[], heardIds: number[], from: number, to: number, vocabulary: Vocabulary): number {
  const step = to >= from ? 1 : -1
  const left = [...lineIds]
  let furthest = from
  for (let j = from; j !== to + step; j += step) {
    const k = left.findIndex((id) => vocabulary.similarity(id, heardIds[j]) >= SAME_WORD)
    if (k < 0) continue
    left.splice(k, 1)
    furthest = j
  }
  return furthest
}

function scoreOf(heardId: number, kinds: Map<number, number>, vocabulary: Vocabulary): number {
  let best = -STRANGER_COST
  for (const [id, weight] of kinds) {
    const similarity = vocabulary.similarity(id, heardId)
    if (similarity >= SAME_WORD) best = Math.max(best, weight * similarity)
  }
  return best
}

/** Share of the line's weight found in the run, every heard word standing for at most one line word. */
function coverage(line: { ids: number[]; weights: number[] }, run: number[], vocabulary: Vocabulary): number {
  const left = [...run]
  let found = 0
  let total = 0
  line.ids.forEach((id, i) => {
    total += line.weights[i]
    let bestAt = -1
    let bestSimilarity = 0
    left.forEach((heardId, k) => {
      const similarity = vocabulary.similarity(id, heardId)
      if (similarity >= SAME_WORD && similarity > bestSimilarity) {
        bestAt = k
        bestSimilarity = similarity
      }
    })
    if (bestAt >= 0) {
      found += line.weights[i] * bestSimilarity
      left.splice(bestAt, 1)
    }
  })
  return total > 0 ? found / total : 0
}
