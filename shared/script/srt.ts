/**
 * SRT captions: numbered cues, "hh:mm:ss,mmm --> hh:mm:ss,mmm", text, a blank line. SRT has no escapes,
 * yet players read HTML-like tags (<i>, <font …>) and braced override codes ({\an8}) in cue text as
 * formatting (common practice): a script line holding such text gets look-alike brackets instead, so it is
 * shown as written rather than obeyed or dropped.
 */
import type { Outline } from '../schemas/outline'
import { captionCues } from './captions'
import { srtTimestamp } from './timecode'

export function toSrt(outline: Outline): string {
  return captionCues(outline)
    .map((c, i) => `${i + 1}\n${srtTimestamp(c.startMs)} --> ${srtTimestamp(c.endMs)}\n${shownAsWritten(c.rows.join('\n'))}\n`)
    .join('\n')
}

const TAG = /<(\/?[a-z][^<>]*)>/gi
const OVERRIDE = /\{\\/g

/** A cue's text with tag-like text and override codes disarmed, a tag broken over its two rows too. */
function shownAsWritten(text: string): string {
  return text.replace(TAG, '‹$1›').replace(OVERRIDE, '{')
}
