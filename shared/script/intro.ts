/**
 * The opening line (rules, from the puzzle's rule set) and the closing line (setter credit and
 * link). Missing credits become bracketed placeholders the presenter can't miss.
 */
import { countWords } from './words'

export interface Credits {
  title: string
  author?: string
  link?: string
  thermometers: number
  status: 'solved' | 'stuck'
}

export const SETTER_PLACEHOLDER = '[setter]'
export const LINK_PLACEHOLDER = '[puzzle link]'
const UNFINISHED_PLACEHOLDER = '[finish the solve here]'

const by = (c: Credits, joiner: string) => (c.author ? `${joiner}${c.author}` : '')

function thermoRule(c: Credits, v: number): string {
  if (c.thermometers === 0) return ''
  const count = c.thermometers === 1 ? 'one thermometer' : `${countWords(c.thermometers)} thermometers`
  const are = c.thermometers === 1 ? 'is' : 'are'
  const rules = [
    ` There ${are} ${count} as well. Along a thermometer the digits get bigger from the bulb, the round end, to the tip, though they don't have to go up by one.`,
    ` On top of that we have ${count}. Starting at the bulb, each cell must be higher than the one before it, all the way to the tip. Gaps are allowed.`,
    ` And there ${are} ${count}: from the bulb to the tip, the digits strictly increase. They can skip numbers on the way.`,
  ]
  return rules[v % rules.length]
}

export const INTRO: ((c: Credits) => string)[] = [
  (c) =>
    `Welcome! Today we're solving ${c.title}${by(c, ' by ')}. The rules: normal sudoku, so every row, every column and every 3 by 3 box holds the digits 1 to 9 once each.${thermoRule(c, 0)} Let's get started.`,
  (c) =>
    `Hello and welcome. This is ${c.title}${by(c, ', set by ')}. Normal sudoku rules apply: the digits 1 to 9 appear once in each row, each column and each of the nine boxes.${thermoRule(c, 1)} Let's have a look.`,
  (c) =>
    `Let's dive into ${c.title}${by(c, ' by ')}. It's classic sudoku to begin with: 1 to 9 once in every row, column and 3 by 3 box.${thermoRule(c, 2)} Here we go.`,
]

export const OUTRO: ((c: Credits) => string)[] = [
  (c) =>
    `${ending(c, 0)} Thanks to ${c.author ?? SETTER_PLACEHOLDER} for a lovely puzzle. The link is ${c.link ?? LINK_PLACEHOLDER} if you'd like to try it yourself. See you next time.`,
  (c) =>
    `${ending(c, 1)} A big thank you to ${c.author ?? SETTER_PLACEHOLDER} for setting this one. You'll find it at ${c.link ?? LINK_PLACEHOLDER}. Thanks for watching.`,
  (c) =>
    `${ending(c, 2)} Credit to ${c.author ?? SETTER_PLACEHOLDER} for the puzzle; it's linked at ${c.link ?? LINK_PLACEHOLDER}. Until next time!`,
]

function ending(c: Credits, v: number): string {
  if (c.status === 'stuck') return `Our notes stop here, so ${UNFINISHED_PLACEHOLDER}.`
  return ["And that's the grid done.", 'There we go, finished!', "And that's the last digit."][v]
}
