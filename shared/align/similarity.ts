/**
 * How alike two spoken words are, 0..1, as the matcher weighs them: a recogniser swaps words that sound alike
 * and caption writers add or drop an ending, so near misses count, but short words must match exactly.
 */
import { distance } from 'fastest-levenshtein'

// Words English speakers say the same way: a recogniser picks either spelling (common practice; list from memory).
const SOUND_ALIKE = [
  ['two', 'to', 'too'], ['four', 'for', 'fore'], ['eight', 'ate'], ['one', 'won'], ['there', 'their', "they're"],
  ['its', "it's"], ['right', 'write'], ['no', 'know'], ['by', 'buy', 'bye'], ['new', 'knew'], ['here', 'hear'],
  ['whole', 'hole'], ['some', 'sum'], ['wait', 'weight'], ['see', 'sea'], ['so', 'sew'], ["we'll", 'well'], ['then', 'than'],
]
const SOUND_ALIKE_SIMILARITY = 0.9
/** Below this a pair of different words is no match at all. */
const NEAR_MISS_FLOOR = 0.75
const SHORTEST_NEAR_MISS = 4

const soundGroup = new Map<string, number>(SOUND_ALIKE.flatMap((group, i) => group.map((w) => [w, i] as const)))

/** Word ↔ small integer, so sequences compare by number. */
export class Vocabulary {
  private readonly ids = new Map<string, number>()
  private readonly words: string[] = []

  idOf(word: string): number {
    let id = this.ids.get(word)
    if (id === undefined) {
      id = this.words.length
      this.ids.set(word, id)
      this.words.push(word)
    }
    return id
  }

  wordOf(id: number): string {
    return this.words[id]
  }

  similarity(a: number, b: number): number {
    return a === b ? 1 : wordSimilarity(this.words[a], this.words[b])
  }
}

function wordSimilarity(a: string, b: string): number {
  const group = soundGroup.get(a)
  if (group !== undefined && group === soundGroup.get(b)) return SOUND_ALIKE_SIMILARITY
  if (Math.min(a.length, b.length) < SHORTEST_NEAR_MISS) return 0
  const s = 1 - distance(a, b) / Math.max(a.length, b.length)
  return s >= NEAR_MISS_FLOOR ? s : 0
}
