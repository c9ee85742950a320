/**
 * The words of a caption file (WebVTT or SRT, told apart by content) with the time each was said, for the matcher.
 * Times inside a cue come from its inline timestamps when it has them, else are shared out by character offset.
 * Automatic captions roll: each cue repeats the end of the one before, so words already given are dropped.
 */
import { parseSync } from 'subtitle'
import webvtt from 'webvtt-parser'
// The full table of named character references, so "&amp;" and the like read as the spec says.
import entities from 'webvtt-parser/html-entities.json'
import type { TimedWord } from '../../shared/align/types'
import { spokenWords } from '../../shared/align/words'

/** The file is not captions this reader understands; the message says why, for the person who uploaded it. */
export class CaptionFileError extends Error {}

/** A block of caption text: its spans, each with the time its first character is said. */
interface Cue {
  startMs: number
  endMs: number
  spans: { text: string; atMs: number }[]
}

// WebVTT, W3C, §4.1: a file starts with an optional BOM and "WEBVTT" followed by a space, tab or line end.
const WEBVTT_SIGNATURE = /^WEBVTT(?:[ \t\r\n]|$)/
// SRT: a counter line (optional in practice) then "hh:mm:ss,mmm --> hh:mm:ss,mmm" (common practice; no published standard).
const SRT_START = /^(?:\d+[ \t]*\r?\n)?[ \t]*\d{1,2}:\d{2}:\d{2}[,.]\d{1,3}[ \t]*-->[ \t]*\d{1,2}:\d{2}:\d{2}[,.]\d{1,3}/
/** How far back a rolling cue's repeat of earlier words is looked for. */
const ROLLING_REPEAT_WORDS = 40

/** Every spoken word of a WebVTT or SRT file, in time order, each with its time. */
export function captionWords(fileText: string): TimedWord[] {
  const text = fileText.replace(/^\uFEFF/, '')
  const start = text.trimStart()
  let cues: Cue[]
  if (WEBVTT_SIGNATURE.test(text)) cues = webVttCues(text)
  else if (SRT_START.test(start)) cues = srtCues(start)
  else throw new CaptionFileError(`This isn't a WebVTT or SRT caption file: it starts with "${preview(start)}" where a caption file starts with WEBVTT or with a cue's number and times.`)
  if (cues.length === 0) throw new CaptionFileError('This caption file has no cues with text, so there is nothing to match the script against.')
  return wordsOf(cues.sort((a, b) => a.startMs - b.startMs || a.endMs - b.endMs))
}

interface WebVttNode {
  type: 'text' | 'object' | 'timestamp'
  value?: string | number
  children?: WebVttNode[]
}
interface WebVttCue {
  startTime: number
  endTime: number
  tree: { children: WebVttNode[] }
}
interface WebVttParser {
  parse(input: string, mode?: string): { cues: WebVttCue[] }
}

function webVttCues(text: string): Cue[] {
  const parser = new (webvtt as { WebVTTParser: new (entityTable: object) => WebVttParser }).WebVTTParser(entities)
  // The parser follows the W3C's rules: NOTE and STYLE blocks, cue settings and styling tags never reach the text.
  return parser.parse(text, 'metadata').cues.map((cue) => {
    const spans: Cue['spans'] = []
    let atMs = cue.startTime * 1000
    const walk = (nodes: WebVttNode[]) => {
      for (const node of nodes) {
        if (node.type === 'timestamp') atMs = Number(node.value) * 1000
        else if (node.type === 'text') spans.push({ text: String(node.value ?? ''), atMs })
        else walk(node.children ?? [])
      }
    }
    walk(cue.tree.children)
    return { startMs: cue.startTime * 1000, endMs: cue.endTime * 1000, spans }
  })
}

function srtCues(text: string): Cue[] {
  let nodes
  try {
    nodes = parseSync(text.replace(/\r\n?/g, '\n'))
  } catch (e) {
    throw new CaptionFileError(`This SRT caption file can't be read: ${(e as Error).message}.`)
  }
  return nodes.flatMap((node) => {
    if (node.type !== 'cue') return []
    // SRT players accept HTML-like tags (<i>, <font …>) and {\an8}-style position codes; neither is spoken.
    const spoken = node.data.text.replace(/<[^>]*>/g, '').replace(/\{\\[^}]*\}/g, '')
    return [{ startMs: node.data.start, endMs: node.data.end, spans: [{ text: spoken, atMs: node.data.start }] }]
  })
}

function wordsOf(cues: Cue[]): TimedWord[] {
  const words: TimedWord[] = []
  let previousEndMs = -Infinity
  for (const cue of cues) {
    const tokens = tokensOf(cue)
    const repeated = repeatedLead(words, tokens, cue.startMs < previousEndMs)
    words.push(...timed(cue, tokens.slice(repeated)))
    previousEndMs = Math.max(previousEndMs, cue.endMs)
  }
  return words
}

interface Token {
  word: string
  /** which stretch of the cue (text between two timestamps) it is in, and where in it */
  stretch: number
  offset: number
}

/** The text between two timestamps of a cue (or its ends) as one run: spans are only styling. */
function stretchesOf(cue: Cue): { text: string; fromMs: number; toMs: number }[] {
  const merged: { text: string; atMs: number }[] = []
  for (const span of cue.spans) {
    const last = merged[merged.length - 1]
    if (last && last.atMs === span.atMs) last.text += span.text
    else merged.push({ ...span })
  }
  return merged.map((m, i) => {
    const fromMs = Math.min(Math.max(m.atMs, cue.startMs), cue.endMs)
    return { text: m.text, fromMs, toMs: Math.max(fromMs, Math.min(merged[i + 1]?.atMs ?? cue.endMs, cue.endMs)) }
  })
}

function tokensOf(cue: Cue): Token[] {
  return stretchesOf(cue).flatMap((stretch, i) =>
    [...stretch.text.matchAll(/\S+/g)].filter((m) => key(m[0]) !== '').map((m) => ({ word: m[0], stretch: i, offset: m.index })),
  )
}

/**
 * Times for the words a cue adds, shared out by character offset over each stretch. A rolling cue's repeated
 * words are not said again, so the stretch they open counts from the first new word.
 */
function timed(cue: Cue, tokens: Token[]): TimedWord[] {
  const stretches = stretchesOf(cue)
  const firstOffset = new Map<number, number>()
  for (const t of tokens) if (!firstOffset.has(t.stretch)) firstOffset.set(t.stretch, t.offset)
  return tokens.map((t) => {
    const stretch = stretches[t.stretch]
    const base = firstOffset.get(t.stretch) ?? 0
    const msPerChar = (stretch.toMs - stretch.fromMs) / Math.max(1, stretch.text.length - base)
    const start = stretch.fromMs + (t.offset - base) * msPerChar
    return { word: t.word, startMs: Math.round(start), endMs: Math.round(start + t.word.length * msPerChar) }
  })
}

/**
 * How many of a cue's first words repeat the last words already taken (a rolling caption). One repeated word
 * counts only when the cue overlaps the one before; two or more always do.
 */
function repeatedLead(taken: TimedWord[], cueWords: Token[], overlaps: boolean): number {
  const recent = taken.slice(-ROLLING_REPEAT_WORDS).map((w) => key(w.word))
  const lead = cueWords.map((w) => key(w.word))
  for (let n = Math.min(recent.length, lead.length); n >= (overlaps ? 1 : 2); n--) {
    let same = true
    for (let i = 0; i < n && same; i++) same = recent[recent.length - n + i] === lead[i]
    if (same) return n
  }
  return 0
}

// Caption words repeat a lot and every rolling check reads the last few dozen again: remembering each word's
// spoken form made a 2 MB file parse in a fraction of the time. Bounded, so a long-running server can't grow it.
const KEYS_REMEMBERED = 50_000
const spokenKeys = new Map<string, string>()

function key(word: string): string {
  let spoken = spokenKeys.get(word)
  if (spoken === undefined) {
    if (spokenKeys.size >= KEYS_REMEMBERED) spokenKeys.clear()
    spoken = spokenWords(word).join(' ')
    spokenKeys.set(word, spoken)
  }
  return spoken
}

function preview(text: string): string {
  const line = text.split(/\r?\n/, 1)[0].slice(0, 40)
  return line.length > 0 ? line : '(an empty line)'
}
