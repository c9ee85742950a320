/**
 * The video description: setter credit, puzzle link, the rules in a line, then one "m:ss Title"
 * line per chapter, the first at 0:00 (common practice for chapter lists in a description). A
 * missing link is marked so it can't go out unnoticed, and times not yet taken from an aligned
 * recording are said to be estimates.
 */
import type { Outline } from '../schemas/outline'
import { LINK_PLACEHOLDER, SETTER_PLACEHOLDER } from './intro'
import { publishedChapters } from './chapters'
import { formatClock } from './timecode'
import { timeline } from './timing'
import { countWords } from './words'

/** Said after the placeholder link, in capitals so it stands out in an upload form. */
export const LINK_MISSING_MARK = '(ADD THE PUZZLE LINK BEFORE PUBLISHING)'
const ESTIMATE_NOTE = 'Times are estimates until the recording is aligned.'

export function toDescription(outline: Outline): string {
  const credit = `${oneLine(outline.title)}, a puzzle by ${oneLine(outline.author ?? SETTER_PLACEHOLDER)}.`
  const link = `Try it yourself: ${outline.link ?? `${LINK_PLACEHOLDER} ${LINK_MISSING_MARK}`}`
  const chapters = publishedChapters(outline).map((c) => `${formatClock(c.startMs)} ${oneLine(c.title)}`)
  const note = timeline(outline).source === 'aligned' ? '' : `\n${ESTIMATE_NOTE}\n`
  return `${credit}\n${link}\n${rulesLine(outline.puzzle.thermometers.length)}\n\n${chapters.join('\n')}\n${note}`
}

function rulesLine(thermometers: number): string {
  const classic = 'Rules: normal sudoku, with the digits 1 to 9 once in every row, column and 3 by 3 box'
  if (thermometers === 0) return `${classic}.`
  const which = thermometers === 1 ? 'the thermometer' : `each of the ${countWords(thermometers)} thermometers`
  return `${classic}; along ${which}, digits rise from the bulb to the tip.`
}

// Each entry is one line of the description: a line break inside a title would add a chapter line of its own.
function oneLine(s: string): string {
  return s.replace(/\s*[\r\n]+\s*/g, ' ')
}
