/**
 * Cutting spoken lines into caption cues: at most two rows of about 42 characters on screen
 * at once (common practice for readable captions), each cue timed by its share of the words.
 */
import type { Outline } from '../schemas/outline'
import { timeline } from './timing'
import { wordCount } from './words'

const CAPTION_ROW_CHARS = 42
const CUE_CHARS = CAPTION_ROW_CHARS * 2

export interface CaptionCue {
  lineId: number
  startMs: number
  endMs: number
  /** one or two rows */
  rows: string[]
}

/** Caption cues for every visible line, in order, using aligned times where there are some. */
export function captionCues(outline: Outline): CaptionCue[] {
  const times = new Map(timeline(outline).lines.map((t) => [t.id, t]))
  const cues: CaptionCue[] = []
  for (const line of outline.lines) {
    const t = times.get(line.id)
    if (!t || t.hidden || t.durationMs <= 0) continue
    // rows are ours to break: a line break of the text's own would end the cue early in WebVTT and SRT
    // (a blank line ends a cue), and what followed it would be read as a block of the file
    const spoken = line.text.replace(/\s+/g, ' ').trim()
    let chunks = chunkText(spoken)
    // Every cue needs a positive length; a line squeezed by alignment gets one cue.
    if (t.durationMs < chunks.length * 200) chunks = [spoken]
    const weights = chunks.map((c) => Math.max(1, wordCount(c)))
    const sum = weights.reduce((a, b) => a + b, 0)
    let acc = 0
    chunks.forEach((chunk, k) => {
      const startMs = t.startMs + Math.round((t.durationMs * acc) / sum)
      acc += weights[k]
      const endMs = t.startMs + Math.round((t.durationMs * acc) / sum)
      cues.push({ lineId: line.id, startMs, endMs, rows: wrapRows(chunk) })
    })
  }
  return cues
}

/** Sentences first; a long sentence breaks at a comma or dash, then between words. */
function chunkText(text: string): string[] {
  // A lone capital before a full stop is an initial ("A. Setter"), not the end of a sentence.
  const sentences = text.split(/(?<=[.!?])(?<!\b[A-Z]\.)\s+/).filter((s) => s.length > 0)
  const chunks: string[] = []
  for (const piece of sentences.flatMap((s) => splitLong(s))) {
    const prev = chunks[chunks.length - 1]
    // Two or three words flash by too fast to read: ride along with the cue before.
    if (prev !== undefined && wordCount(piece) < 4 && prev.length + piece.length + 1 <= CUE_CHARS) chunks[chunks.length - 1] = `${prev} ${piece}`
    else chunks.push(piece)
  }
  return chunks
}

function splitLong(s: string): string[] {
  if (s.length <= CUE_CHARS) return [s]
  const words = s.split(' ')
  const out: string[] = []
  let cur = ''
  for (const w of words) {
    const next = cur ? `${cur} ${w}` : w
    if (next.length > CUE_CHARS && cur) {
      out.push(cur)
      cur = w
    } else {
      cur = next
      // Prefer to end a cue at a pause when it is already reasonably full.
      if (cur.length >= CUE_CHARS * 0.6 && /[,;:]$/.test(w)) {
        out.push(cur)
        cur = ''
      }
    }
  }
  if (cur) out.push(cur)
  return out
}

/** Two balanced rows when a cue is longer than one row. */
function wrapRows(chunk: string): string[] {
  const words = chunk.split(' ')
  // one word longer than a row stays one row: splitting it at nothing would leave the second row empty
  if (chunk.length <= CAPTION_ROW_CHARS || words.length === 1) return [chunk]
  let best = 1
  let bestScore = Infinity
  for (let k = 1; k < words.length; k++) {
    const a = words.slice(0, k).join(' ').length
    const b = words.slice(k).join(' ').length
    const score = Math.max(a, b)
    if (score < bestScore) {
      bestScore = score
      best = k
    }
  }
  return [words.slice(0, best).join(' '), words.slice(best).join(' ')]
}
