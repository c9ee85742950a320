/**
 * Caption files for a test recording, written the way automatic captions come out of video platforms: lower case
 * without punctuation, numbers as digits, a few words misheard, cues of at most 42 characters (common practice for
 * subtitles) that end at a pause of a second or more, with times shifted and jittered. In the rolling style each cue
 * repeats the line before it and times its new words with inline timestamps, as automatic WebVTT captions do
 * (from memory); the other styles give a cue's start and end only.
 */
import { between, pick, seededRandom, type Random } from './random'
import type { Recording } from './speak'

export type CaptionFormat = 'vtt' | 'srt'

export interface CaptionStyle {
  format: CaptionFormat
  /** each cue shows the previous cue's line above its own, and times its words */
  rolling: boolean
  seed: number
}

const CUE_CHARACTERS = 42
/** A silence this long ends a cue, as it does in automatic captions. */
const CUE_BREAK_MS = 1000
const WORD_JITTER_MS = 80
const MISHEARD_SHARE = 0.04
const MISHEARD = ['the', 'a', 'and', 'uh', 'in', 'there', 'for', 'it', 'so']
const WHOLE_SHIFT_MS = 300
const CUE_JITTER_MS = 150

interface CaptionWord {
  text: string
  startMs: number
  endMs: number
}

/** The caption file of a recording in the given style. */
export function captionFile(recording: Recording, style: CaptionStyle): string {
  const random = seededRandom(style.seed)
  const words = captionWords(recording, random)
  const shift = between(random, -WHOLE_SHIFT_MS, WHOLE_SHIFT_MS)
  const cues = cutIntoCues(words).map((cue) => {
    const jitter = between(random, -CUE_JITTER_MS, CUE_JITTER_MS)
    const startMs = Math.max(0, cue[0].startMs + shift + jitter)
    let wordMs = startMs
    const text = style.rolling
      ? cue.map((w, i) => {
        if (i === 0) return w.text
        // inline timestamps must rise within their cue (WebVTT, W3C, §4.2.3)
        wordMs = Math.max(wordMs + 10, w.startMs + shift + between(random, -WORD_JITTER_MS, WORD_JITTER_MS))
        return `<${clock(wordMs, '.')}><c> ${w.text}</c>`
      }).join('')
      : cue.map((w) => w.text).join(' ')
    return { text, plain: cue.map((w) => w.text).join(' '), startMs, endMs: Math.max(wordMs, cue[cue.length - 1].endMs + shift) + 400 }
  })
  cues.forEach((cue, i) => {
    // a cue stays up until the next one replaces it, as automatic captions do
    const next = cues[i + 1]
    if (next && next.startMs - cue.endMs < CUE_BREAK_MS) cue.endMs = next.startMs
    cue.endMs = Math.max(cue.endMs, cue.startMs + 200)
  })
  const shown = cues.map((cue, i) => ({ ...cue, text: style.rolling && i > 0 ? `${cues[i - 1].plain}\n${cue.text}` : cue.text }))
  return style.format === 'vtt' ? toVtt(shown) : toSrt(shown)
}

/** The words said, timed by their place in the utterance's characters, written as automatic captions write them. */
function captionWords(recording: Recording, random: Random): CaptionWord[] {
  return recording.spoken.flatMap((u) => {
    const text = u.text.toLowerCase().replace(/[^\p{L}\p{N}' -]+/gu, ' ').replace(/-/g, ' ')
    const msPerChar = (u.endMs - u.startMs) / Math.max(1, text.length)
    return [...text.matchAll(/\S+/g)].map((m) => ({
      text: random() < MISHEARD_SHARE ? pick(random, MISHEARD) : m[0],
      startMs: u.startMs + m.index * msPerChar,
      endMs: u.startMs + (m.index + m[0].length) * msPerChar,
    }))
  })
}

function cutIntoCues(words: CaptionWord[]): CaptionWord[][] {
  const cues: CaptionWord[][] = []
  let cue: CaptionWord[] = []
  let length = 0
  for (const word of words) {
    const previous = cue[cue.length - 1]
    if (previous && (length + 1 + word.text.length > CUE_CHARACTERS || word.startMs - previous.endMs > CUE_BREAK_MS)) {
      cues.push(cue)
      cue = []
      length = 0
    }
    length += (cue.length > 0 ? 1 : 0) + word.text.length
    cue.push(word)
  }
  if (cue.length > 0) cues.push(cue)
  return cues
}

interface Cue {
  text: string
  startMs: number
  endMs: number
}

function toVtt(cues: Cue[]): string {
  return `WEBVTT\n\n${cues.map((c) => `${clock(c.startMs, '.')} --> ${clock(c.endMs, '.')}\n${c.text}\n`).join('\n')}`
}

function toSrt(cues: Cue[]): string {
  return cues.map((c, i) => `${i + 1}\n${clock(c.startMs, ',')} --> ${clock(c.endMs, ',')}\n${c.text}\n`).join('\n')
}

function clock(ms: number, separator: string): string {
  const total = Math.round(ms)
  const pad = (n: number, width = 2) => String(n).padStart(width, '0')
  return `${pad(Math.floor(total / 3_600_000))}:${pad(Math.floor(total / 60_000) % 60)}:${pad(Math.floor(total / 1000) % 60)}${separator}${pad(total % 1000, 3)}`
}
