/**
 * SRT captions: numbered cues, "hh:mm:ss,mmm --> hh:mm:ss,mmm", text, a blank line.
 */
import type { Outline } from '../schemas/outline'
import { captionCues } from './captions'
import { srtTimestamp } from './timecode'

export function toSrt(outline: Outline): string {
  return captionCues(outline)
    .map((c, i) => `${i + 1}\n${srtTimestamp(c.startMs)} --> ${srtTimestamp(c.endMs)}\n${c.rows.join('\n')}\n`)
    .join('\n')
}
