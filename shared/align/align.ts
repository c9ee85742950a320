/**
 * Where each script line starts in a recording, from the words heard in it (a recogniser's or a caption file's).
 * The script's words and the heard words are aligned in order (./sequence); each line keeps the tightest group of
 * its matched words. A line whose clauses were said in another order loses part of itself to that alignment, so a
 * second search (./said-in-any-order) looks, after the previous line, for the run of heard words holding most of
 * its words in any order, and is believed when it finds clearly more. A line is placed only when what was found
 * covers enough of what it says; its start is the first word found, moved back over the line's own words said just
 * before (missed by the alignment, or said in another order) and over leading filler.
 */
import type { LineProposal } from '../schemas/recording'
import { alignSequences, type WordPair } from './sequence'
import { saidInAnyOrder } from './said-in-any-order'
import { Vocabulary } from './similarity'
import type { TimedWord } from './types'
import { spokenWords } from './words'

interface AlignOptions {
  /** 0..1: a line whose matched words weigh less than this share of all its words is left unplaced */
  minConfidence?: number
}

export interface Alignment {
  /** one per placed line, in line order, starts ascending */
  proposals: LineProposal[]
  /** ids of lines that could not be placed confidently, in line order */
  unplaced: number[]
}

const DEFAULT_MIN_CONFIDENCE = 0.4
/** A line said in another order is taken from the any-order search only when it finds this much more of it. */
const REORDER_MARGIN = 0.1
/** A line the in-order match found this well bounds the search for the lines before it. */
const CLEAR_LINE = 0.6
/** A later line whose in-order share beats this line's by this much also bounds this line's any-order search. */
const CLEARLY_BETTER = 0.3
/** Speaking rate assumed until the recording shows its own (about 160 words a minute: common practice for narration). */
const DEFAULT_MS_PER_WORD = 375
/** Matched words further apart in the heard words than their distance in the script explains (× this, plus a few) belong to different places. */
const STRETCH_TOLERANCE = 2
const STRETCH_SLACK = 3
/** A silence longer than this is between lines, not inside one. */
const LONGEST_PAUSE_IN_A_LINE_MS = 1500
/** Silence before a word that marks the start of an utterance. */
const UTTERANCE_GAP_MS = 700
const FILLERS = new Set(['so', 'okay', 'ok', 'right', 'now', 'well', 'alright', 'um', 'uh', 'er', 'erm', 'and', 'then', 'oh'])
const MOST_FILLERS = 3
/** How much of the line's own vocabulary must turn up before its kept words to move its start there. */
const SAID_EARLIER_WEIGHT = 0.8

/** Proposes a start for every script line it can place in the heard words, and names the lines it cannot. */
export function alignLines(lines: { lineId: number; text: string }[], words: TimedWord[], options: AlignOptions = {}): Alignment {
  const minConfidence = options.minConfidence ?? DEFAULT_MIN_CONFIDENCE
  const vocabulary = new Vocabulary()
  const script = scriptWords(lines, vocabulary)
  const heard = heardWords(words, vocabulary)
  const pairs = alignSequences(script.ids, heard.ids, script.weights, vocabulary)
  const msPerWord = speakingRate(pairs, script.lineOf, heard)

  // pairs ascend in script order, so each line's pairs are the next run of them
  let next = 0
  const firstLook = lines.map((_, index) => {
    const from = script.lineStarts[index]
    const to = script.lineStarts[index + 1]
    const first = next
    while (next < pairs.length && pairs[next].s < to) next++
    const group = tightestGroup(pairs.slice(first, next), script.weights, heard, msPerWord)
    return { group, confidence: share(group, script.weights, from, to) }
  })

  const proposals: LineProposal[] = []
  const unplaced: number[] = []
  // The heard word before which no later line may start: the last word of the latest placed line.
  let floor = -1
  let previousStart = -1
  lines.forEach((line, index) => {
    const from = script.lineStarts[index]
    const to = script.lineStarts[index + 1]
    const group = tightestGroup(firstLook[index].group.filter((p) => p.r > floor), script.weights, heard, msPerWord)
    const inOrder = share(group, script.weights, from, to)
    const anyOrder = saidInAnyOrder(
      { ids: script.ids.slice(from, to), weights: [...script.weights.subarray(from, to)] },
      heard,
      {
        after: floor,
        before: nextLineStart(firstLook, index, floor, group, to - from, heard.ids.length),
        longestRun: Math.ceil((to - from) * 1.5) + STRETCH_SLACK * 2,
        longestPauseMs: LONGEST_PAUSE_IN_A_LINE_MS,
      },
      vocabulary,
    )
    const reordered = anyOrder !== null && anyOrder.covered > inOrder + REORDER_MARGIN
    const confidence = reordered ? anyOrder.covered : inOrder
    if (confidence < minConfidence) {
      unplaced.push(line.lineId)
      return
    }
    const span = { from, to, floor, msPerWord }
    const start = reordered ? withFillers(anyOrder.first, span, heard, vocabulary) : startOf(group, span, script, heard, vocabulary)
    const startMs = Math.round(Math.max(start, previousStart + 1, 0))
    proposals.push({ lineId: line.lineId, startMs, confidence: Math.min(1, Math.round(confidence * 100) / 100) })
    previousStart = startMs
    floor = Math.max(reordered ? anyOrder.last : -1, group.length > 0 ? group[group.length - 1].r : -1)
  })
  return { proposals, unplaced }
}

/**
 * Where the search for a line said out of order stops: at the next line the in-order match found clearly (or
 * far better than this one, so a line's words aren't taken by a neighbour that shares many of them), and
 * never further past the line's own matches (or the previous line) than twice its length — which also keeps the
 * search short when many lines in a row could not be placed.
 */
function nextLineStart(firstLook: { group: WordPair[]; confidence: number }[], index: number, floor: number, group: WordPair[], lineWords: number, heardCount: number): number {
  const reach = Math.min(heardCount, (group.length > 0 ? group[group.length - 1].r : floor) + lineWords * 2 + STRETCH_SLACK)
  for (let k = index + 1; k < firstLook.length; k++) {
    const next = firstLook[k]
    // a later line found clearly, or found in order far better than this one: its words are its own
    const clear = next.confidence >= CLEAR_LINE || next.confidence >= firstLook[index].confidence + CLEARLY_BETTER
    if (clear && next.group.length > 0 && next.group[0].r > floor) return Math.min(next.group[0].r, reach)
  }
  return reach
}

function share(group: WordPair[], weights: Float64Array, from: number, to: number): number {
  const lineWeight = sum(weights, from, to)
  return lineWeight > 0 ? groupWeight(group, weights) / lineWeight : 0
}

interface ScriptWords {
  ids: number[]
  /** line index of every word */
  lineOf: Int32Array
  /** index of each line's first word, plus the end */
  lineStarts: number[]
  /** how much a word tells where it is: rare words more than "the" (inverse line frequency) */
  weights: Float64Array
}

function scriptWords(lines: { text: string }[], vocabulary: Vocabulary): ScriptWords {
  const perLine = lines.map((l) => spokenWords(l.text).map((w) => vocabulary.idOf(w)))
  const ids = perLine.flat()
  const lineOf = new Int32Array(ids.length)
  const lineStarts: number[] = []
  const linesWith = new Map<number, number>()
  let at = 0
  perLine.forEach((lineIds, index) => {
    lineStarts.push(at)
    lineOf.fill(index, at, at + lineIds.length)
    at += lineIds.length
    for (const id of new Set(lineIds)) linesWith.set(id, (linesWith.get(id) ?? 0) + 1)
  })
  lineStarts.push(at)
  const weights = Float64Array.from(ids, (id) => Math.min(3, Math.max(0.15, Math.log((lines.length + 1) / ((linesWith.get(id) ?? 0) + 0.5)))))
  return { ids, lineOf, lineStarts, weights }
}

interface HeardWords {
  ids: number[]
  startMs: Float64Array
  endMs: Float64Array
}

/** Heard words as spoken words; one that reads as several ("15th", "r3c4") shares its time by length. */
function heardWords(words: TimedWord[], vocabulary: Vocabulary): HeardWords {
  const ids: number[] = []
  const starts: number[] = []
  const ends: number[] = []
  for (const w of words) {
    const parts = spokenWords(w.word)
    const letters = parts.reduce((n, p) => n + p.length, 0)
    let t = w.startMs
    for (const part of parts) {
      const length = ((w.endMs - w.startMs) * part.length) / letters
      ids.push(vocabulary.idOf(part))
      starts.push(t)
      ends.push(t + length)
      t += length
    }
  }
  return { ids, startMs: Float64Array.from(starts), endMs: Float64Array.from(ends) }
}

/** Milliseconds per script word, the median over neighbouring matches inside one line. */
function speakingRate(pairs: WordPair[], lineOf: Int32Array, heard: HeardWords): number {
  const rates: number[] = []
  for (let k = 1; k < pairs.length; k++) {
    const a = pairs[k - 1]
    const b = pairs[k]
    const words = b.s - a.s
    if (lineOf[a.s] === lineOf[b.s] && words <= 3 && b.r - a.r === words) rates.push((heard.startMs[b.r] - heard.startMs[a.r]) / words)
  }
  if (rates.length < 5) return DEFAULT_MS_PER_WORD
  rates.sort((x, y) => x - y)
  return rates[rates.length >> 1]
}

/**
 * A line's matched words cut where two neighbours lie further apart (in heard words or in time) than their distance
 * in the script explains; the heaviest piece is where the line was said, the rest are chance matches elsewhere.
 */
function tightestGroup(own: WordPair[], weights: Float64Array, heard: HeardWords, msPerWord: number): WordPair[] {
  if (own.length === 0) return own
  let best: WordPair[] = []
  let bestWeight = -1
  let piece: WordPair[] = [own[0]]
  const close = (piece: WordPair[]) => {
    const w = groupWeight(piece, weights)
    if (w > bestWeight) {
      best = piece
      bestWeight = w
    }
  }
  for (let k = 1; k < own.length; k++) {
    const a = own[k - 1]
    const b = own[k]
    const allowedWords = (b.s - a.s) * STRETCH_TOLERANCE + STRETCH_SLACK
    const allowedMs = (b.s - a.s) * msPerWord * STRETCH_TOLERANCE + LONGEST_PAUSE_IN_A_LINE_MS
    if (b.r - a.r > allowedWords || heard.startMs[b.r] - heard.startMs[a.r] > allowedMs) {
      close(piece)
      piece = []
    }
    piece.push(b)
  }
  close(piece)
  return best
}

function groupWeight(group: WordPair[], weights: Float64Array): number {
  let total = 0
  for (const p of group) total += weights[p.s] * p.similarity
  return total
}

function sum(values: Float64Array, from: number, to: number): number {
  let total = 0
  for (let i = from; i < to; i++) total += values[i]
  return total
}

interface LineSpan {
  /** the line's words in the script */
  from: number
  to: number
  /** heard words up to here belong to earlier lines */
  floor: number
  msPerWord: number
}

/** The line's start in ms: its first matched word, moved back over its own earlier words and leading filler. */
function startOf(group: WordPair[], span: LineSpan, script: ScriptWords, heard: HeardWords, vocabulary: Vocabulary): number {
  const first = group[0]
  let startIndex = saidEarlier(group, span, script, heard, vocabulary)
  let startMs = heard.startMs[startIndex]
  if (startIndex === first.r && first.s > span.from) {
    // The line's first words were not recognised as such: they were said just before, as heard words the
    // alignment couldn't use, or lost altogether — then the speaking rate says how long they took.
    const missed = first.s - span.from
    const earliestMs = heard.startMs[first.r] - missed * span.msPerWord * 1.5 - 300
    let j = first.r - 1
    while (j > span.floor && first.r - j <= missed + 2 && heard.startMs[j] >= earliestMs && heard.startMs[j + 1] - heard.endMs[j] < UTTERANCE_GAP_MS) j--
    if (j + 1 < first.r) {
      startIndex = j + 1
      startMs = heard.startMs[startIndex]
    } else {
      const previousEnd = span.floor >= 0 ? heard.endMs[span.floor] : 0
      startMs = Math.max(previousEnd, heard.startMs[first.r] - missed * span.msPerWord)
    }
  }
  if (startMs !== heard.startMs[startIndex]) return startMs
  return withFillers(startIndex, span, heard, vocabulary)
}

/** The start of heard word `index`, or of the filler ("so", "okay") said right before it. */
function withFillers(index: number, span: LineSpan, heard: HeardWords, vocabulary: Vocabulary): number {
  let startIndex = index
  let fillers = 0
  while (
    fillers < MOST_FILLERS && startIndex - 1 > span.floor && FILLERS.has(vocabulary.wordOf(heard.ids[startIndex - 1])) &&
    heard.startMs[startIndex] - heard.endMs[startIndex - 1] < UTTERANCE_GAP_MS
  ) {
    startIndex--
    fillers++
  }
  return heard.startMs[startIndex]
}

/**
 * The earliest heard word just before the group that is one of the line's own unmatched words: a clause said
 * before the one the alignment kept. Up to two strangers may sit between such words; a long pause ends the search.
 */
function saidEarlier(group: WordPair[], span: LineSpan, script: ScriptWords, heard: HeardWords, vocabulary: Vocabulary): number {
  const matched = new Set(group.map((p) => p.s))
  const unmatched: number[] = []
  for (let s = span.from; s < span.to; s++) if (!matched.has(s)) unmatched.push(s)
  const first = group[0].r
  let earliest = first
  let found = 0
  let strangers = 0
  for (let j = first - 1; j > span.floor && strangers <= 2 && unmatched.length > 0; j--) {
    if (heard.startMs[j + 1] - heard.endMs[j] >= LONGEST_PAUSE_IN_A_LINE_MS) break
    const k = unmatched.findIndex((s) => vocabulary.similarity(script.ids[s], heard.ids[j]) >= 0.8)
    if (k < 0) {
      strangers++
      continue
    }
    found += script.weights[unmatched[k]]
    unmatched.splice(k, 1)
    strangers = 0
    earliest = j
  }
  // A lone common word ("the") a few words back is as likely chatter; right before the group it is the line's own.
  return found >= SAID_EARLIER_WEIGHT || first - earliest === 1 ? earliest : first
}
