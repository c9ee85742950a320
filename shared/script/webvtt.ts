/**
 * W3C WebVTT exports: a chapters track (kind=chapters) and captions of the script.
 * https://www.w3.org/TR/webvtt1/
 */
import type { Outline } from '../schemas/outline'
import { captionCues } from './captions'
import { publishedChapters } from './chapters'
import { vttTimestamp } from './timecode'

/** A WebVTT file for a `<track kind="chapters">`: one cue per chapter, its text the title. */
export function toWebVttChapters(outline: Outline): string {
  const cues = publishedChapters(outline).map(
    (c, i) => `chapter-${i + 1}\n${vttTimestamp(c.startMs)} --> ${vttTimestamp(c.endMs)}\n${escapeCueText(c.title)}`,
  )
  return `WEBVTT\n\n${cues.join('\n\n')}\n`
}

/** WebVTT captions of every visible line. */
export function toWebVttCaptions(outline: Outline): string {
  const cues = captionCues(outline).map(
    (c, i) => `${i + 1}\n${vttTimestamp(c.startMs)} --> ${vttTimestamp(c.endMs)}\n${c.rows.map(escapeCueText).join('\n')}`,
  )
  return `WEBVTT\n\n${cues.join('\n\n')}\n`
}

/**
 * Cue text is markup: &, < and > must be escaped (which also keeps "-->" out of it). And a line break
 * is a row break, a blank line the end of the cue: a title's own line breaks become spaces.
 */
function escapeCueText(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/[\r\n]+/g, ' ')
}
