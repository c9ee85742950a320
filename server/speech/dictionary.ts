import { readFile } from 'node:fs/promises'
import { MediaToolError } from '../media/run-tool'

export const MODEL_DIR = '/usr/share/pocketsphinx/model/en-us'
export const SPHINX_INSTALL_HINT = 'npm start installs it; or run: apt-get install -y pocketsphinx pocketsphinx-en-us'

/** Pronouncing dictionary: word → its dictionary lines ("word PH ON ES", "word(2) …" for variants). */
export type Pronunciations = ReadonlyMap<string, readonly string[]>

let loading: Promise<Pronunciations> | undefined

/** The English pronouncing dictionary that comes with pocketsphinx-en-us, read once per process (~135,000 words). */
export function loadPronunciations(): Promise<Pronunciations> {
  loading ??= readPronunciations(`${MODEL_DIR}/cmudict-en-us.dict`).catch((error: unknown) => {
    loading = undefined
    throw error
  })
  return loading
}

async function readPronunciations(path: string): Promise<Pronunciations> {
  const text = await readFile(path, 'utf8').catch((error: NodeJS.ErrnoException) => {
    if (error.code === 'ENOENT') throw new MediaToolError('pocketsphinx', `The English speech model is not installed on this server. ${SPHINX_INSTALL_HINT}`)
    throw error
  })
  const byWord = new Map<string, string[]>()
  for (const line of text.split('\n')) {
    const space = line.indexOf(' ')
    if (space <= 0) continue
    const word = line.slice(0, space).replace(/\(\d+\)$/, '')
    const lines = byWord.get(word)
    if (lines) lines.push(line)
    else byWord.set(word, [line])
  }
  return byWord
}

// Trade words the general dictionary lacks, in its phone set (pronunciation from memory).
const TRADE_WORDS: Record<string, string> = { sudoku: 'S UW D OW K UW', sudokus: 'S UW D OW K UW Z' }

/**
 * The pronunciations of a take's words: the dictionary's own; a trade word it lacks; the American
 * spelling's for a British doubled l ("pencilled" → "penciled"), as the dictionary is American; or for a
 * possessive it lacks ("box's") the word's own plus the ending, said IH Z after a hissing sound, S after
 * another voiceless one, Z otherwise (English spelling rules, common practice). Words with none are left out.
 */
export function takePronunciations(words: Iterable<string>, pronunciations: Pronunciations): Map<string, string[]> {
  const found = new Map<string, string[]>()
  for (const word of new Set(words)) {
    const lines = pronunciations.get(word) ?? tradeWord(word) ?? americanSpelling(word, pronunciations) ?? possessive(word, pronunciations)
    if (lines) found.set(word, [...lines])
  }
  return found
}

/** The dictionary file pocketsphinx reads, holding just these words, so it loads in a moment instead of reading all 135,000. */
export const dictionaryText = (take: Map<string, string[]>) => `${[...take.values()].flat().join('\n')}\n`

const tradeWord = (word: string) => (TRADE_WORDS[word] ? [`${word} ${TRADE_WORDS[word]}`] : undefined)

function americanSpelling(word: string, pronunciations: Pronunciations): string[] | undefined {
  const american = word.replace(/ll(ed|ing|er)$/, 'l$1')
  if (american === word) return undefined
  return pronunciations.get(american)?.map((line) => word + line.slice(american.length))
}

const HISSING = new Set(['S', 'Z', 'SH', 'ZH', 'CH', 'JH'])
const VOICELESS = new Set(['P', 'T', 'K', 'F', 'TH'])

function possessive(word: string, pronunciations: Pronunciations): string[] | undefined {
  if (!word.endsWith("'s")) return undefined
  const base = pronunciations.get(word.slice(0, -2))
  return base?.map((line, i) => {
    const phones = line.split(' ').slice(1)
    const last = phones.at(-1) ?? ''
    const ending = HISSING.has(last) ? 'IH Z' : VOICELESS.has(last) ? 'S' : 'Z'
    return `${i === 0 ? word : `${word}(${i + 1})`} ${phones.join(' ')} ${ending}`
  })
}
