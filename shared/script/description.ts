/**
 * The video description: setter credit, puzzle link, then one "m:ss Title" line per chapter,
 * the first at 0:00 (common practice for chapter lists in a description).
 */
import type { Outline } from '../schemas/outline'
import { LINK_PLACEHOLDER, SETTER_PLACEHOLDER } from './intro'
import { publishedChapters } from './chapters'
import { formatClock } from './timecode'

export function toDescription(outline: Outline): string {
  const credit = `${oneLine(outline.title)}, a puzzle by ${oneLine(outline.author ?? SETTER_PLACEHOLDER)}.`
  const link = `Try it yourself: ${outline.link ?? LINK_PLACEHOLDER}`
  const chapters = publishedChapters(outline).map((c) => `${formatClock(c.startMs)} ${oneLine(c.title)}`)
  return `${credit}\n${link}\n\n${chapters.join('\n')}\n`
}

// Each entry is one line of the description: a line break inside a title would add a chapter line of its own.
function oneLine(s: string): string {
  return s.replace(/\s*[\r\n]+\s*/g, ' ')
}
