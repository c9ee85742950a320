/**
 * What the presenter says, in order: the take's lines as written (plain) or as a person would say them
 * (paraphrased): clauses swapped, words swapped for synonyms, filler, the opening words dropped, lines left out,
 * chatter between lines and pauses of 0.5–6 s. Seeded, so a variant is the same every time.
 */
import { between, pick, seededRandom, type Random } from './random'
import type { TakeLine } from './take'

export type Variant = 'plain' | 'paraphrased'

interface Utterance {
  /** the script line said, or null for chatter */
  lineId: number | null
  text: string
  /** silence before it */
  pauseMs: number
}

export interface Performance {
  utterances: Utterance[]
  /** lines the presenter left out */
  absent: number[]
}

const SYNONYMS: Record<string, string[]> = {
  cell: ['square', 'spot'],
  cells: ['squares', 'spots'],
  digit: ['number'],
  digits: ['numbers'],
  only: ['just'],
  must: ['has to'],
  because: ['since', 'as'],
  now: ['at this point'],
  can: ['is able to'],
  "can't": ['cannot'],
  "it's": ['it is'],
  "there's": ['there is'],
  options: ['choices'],
  look: ['peek'],
  goes: ['lands'],
  needs: ['wants'],
}
const OPENERS = ['So,', 'Okay,', 'Right,', 'Now then,', 'Alright,']
const ASIDES = ['you know,', 'I think,', 'basically,', 'if you see what I mean,']
const CHATTER = [
  'Let me just have a quick sip of tea before we carry on.',
  'I hope everyone watching is having a lovely evening.',
  'Thank you all for the kind comments on the last video.',
  'My cat has just walked across the desk, sorry about that.',
  'This is the bit I was looking forward to.',
  'Give me a moment, I want to double check that.',
  'Ooh, this is rather pretty, I like it.',
  'If you are enjoying this, do tell a friend about the channel.',
  'Hang on, I lost my place for a second there.',
  'It is raining quite heavily here today.',
]

/** How a take is said in one variant; `seed` picks the paraphrases, pauses and dropped lines. */
export function perform(lines: TakeLine[], variant: Variant, seed: number): Performance {
  const random = seededRandom(seed)
  if (variant === 'plain') return { utterances: lines.map((l) => ({ lineId: l.lineId, text: l.text, pauseMs: between(random, 400, 1200) })), absent: [] }
  const utterances: Utterance[] = []
  const absent: number[] = []
  for (const line of lines) {
    if (random() < 0.15) utterances.push({ lineId: null, text: pick(random, CHATTER), pauseMs: between(random, 500, 6000) })
    // the first line stays: a take always starts with its welcome
    if (line.lineId > 1 && random() < 0.06) {
      absent.push(line.lineId)
      continue
    }
    utterances.push({ lineId: line.lineId, text: paraphrase(line.text, random), pauseMs: between(random, 500, 6000) })
  }
  return { utterances, absent }
}

function paraphrase(text: string, random: Random): string {
  let out = text
  if (random() < 0.3) out = swapClauses(out)
  out = out.replace(/[A-Za-z']+/g, (word) => {
    const options = SYNONYMS[word.toLowerCase()]
    return options && random() < 0.5 ? pick(random, options) : word
  })
  if (random() < 0.2) out = dropOpeningWords(out, 1 + Math.floor(random() * 3))
  if (random() < 0.2) out = insertAside(out, pick(random, ASIDES), random)
  if (random() < 0.3) out = `${pick(random, OPENERS)} ${out[0].toLowerCase()}${out.slice(1)}`
  return out
}

/** Two sentences said in the other order, or the two halves of a sentence around its first comma. */
function swapClauses(text: string): string {
  const sentences = text.match(/[^.!?]+[.!?]+\s*/g)
  if (sentences && sentences.length >= 2) {
    const [a, b, ...rest] = sentences.map((s) => s.trim())
    return [b, a, ...rest].join(' ')
  }
  const comma = text.indexOf(', ')
  if (comma < 0) return text
  const first = text.slice(0, comma)
  const second = text.slice(comma + 2).replace(/[.!?]+$/, '')
  return `${second[0].toUpperCase()}${second.slice(1)}, ${first[0].toLowerCase()}${first.slice(1)}.`
}

function dropOpeningWords(text: string, count: number): string {
  const words = text.split(' ')
  return words.length > count + 4 ? words.slice(count).join(' ') : text
}

function insertAside(text: string, aside: string, random: Random): string {
  const words = text.split(' ')
  const at = 2 + Math.floor(random() * Math.max(1, words.length - 3))
  return [...words.slice(0, at), aside, ...words.slice(at)].join(' ')
}
