import type { TimedWord } from '../../shared/align/types'
import type { Segment } from './segments'

// what the recogniser marks that nobody said: utterance bounds, silence, and noises such as [NOISE], ++BREATH++
const NOT_SPOKEN = /^(<s>|<\/s>|<sil>|\[.*\]|\+\+.*\+\+)$/
const UTTERANCE_ID = /^u(\d+)$/
// "uttid S scale T total A acoustic L language", then per word "startFrame acoustic language word"
const HEADER_FIELDS = 9
const FRAME_MS = 10

/** The utterance id pocketsphinx_batch is given for segment i, and reports it back under. */
export const utteranceId = (i: number) => `u${i}`

/**
 * pocketsphinx_batch's word segmentation (-hypseg): one line per utterance, word start frames relative
 * to the utterance ("word(2)" names a pronunciation variant). A word ends where the next begins; the
 * utterance's segment gives the absolute time.
 */
export function readSegmentation(text: string, segments: readonly Segment[]): TimedWord[] {
  const words: TimedWord[] = []
  for (const line of text.split('\n')) {
    const fields = line.trim().split(/\s+/)
    const segment = segments[Number(UTTERANCE_ID.exec(fields[0])?.[1] ?? NaN)]
    if (!segment) continue
    const entries: { startFrame: number; word: string }[] = []
    for (let at = HEADER_FIELDS; at + 3 < fields.length; at += 4) entries.push({ startFrame: Number(fields[at]), word: fields[at + 3] })
    const lastFrame = segment.endFrame - segment.startFrame + 1
    entries.forEach(({ startFrame, word }, i) => {
      if (NOT_SPOKEN.test(word)) return
      words.push({
        word: word.replace(/\(\d+\)$/, ''),
        startMs: (segment.startFrame + startFrame) * FRAME_MS,
        endMs: (segment.startFrame + (entries[i + 1]?.startFrame ?? lastFrame)) * FRAME_MS,
      })
    })
  }
  return words
}

/**
 * The utterances one pocketsphinx_batch has finished, from its log ("u12 done ----"), which it writes
 * unbuffered: the frames of speech decoded so far.
 */
export class UtteranceLog {
  private partial = ''
  decodedFrames = 0

  constructor(private readonly segments: readonly Segment[]) {}

  /** true when this chunk finished an utterance */
  take(chunk: Buffer): boolean {
    const lines = (this.partial + chunk.toString('utf8')).split('\n')
    this.partial = lines.pop() ?? ''
    let finished = false
    for (const line of lines) {
      const done = /^u(\d+) done/.exec(line)
      const segment = done ? this.segments[Number(done[1])] : undefined
      if (!segment) continue
      this.decodedFrames += segment.endFrame - segment.startFrame + 1
      finished = true
    }
    return finished
  }
}
