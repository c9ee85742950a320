/**
 * npm run --silent outline -- <puzzle.json | -> [--format json|vtt|vtt-chapters|srt|description]
 *                                              [--pace 160] [--names words|coords]
 * Runs the engine and the script writer and prints the outline (JSON) or one export on stdout.
 * Exit codes: 0 done, 2 bad puzzle or bad arguments (message on stderr). A stable contract.
 */
import { readFileSync } from 'node:fs'
import { parsePuzzle, solvePath } from '../shared/engine/index'
import {
  buildOutline,
  toDescription,
  toOutlineJson,
  toSrt,
  toWebVttCaptions,
  toWebVttChapters,
  type NamingStyle,
  type Outline,
} from '../shared/script/index'

const FORMATS: Record<string, (o: Outline) => string> = {
  json: (o) => `${toOutlineJson(o)}\n`,
  vtt: toWebVttCaptions,
  'vtt-chapters': toWebVttChapters,
  srt: toSrt,
  description: toDescription,
}
const USAGE = 'usage: npm run --silent outline -- <puzzle.json | -> [--format json|vtt|vtt-chapters|srt|description] [--pace 160] [--names words|coords]'

class UsageError extends Error {}

function parseArgs(argv: string[]) {
  let file: string | undefined
  let format = 'json'
  let pace: number | undefined
  let names: NamingStyle = 'words'
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]
    const value = () => {
      const v = argv[++i]
      if (v === undefined) throw new UsageError(`${arg} needs a value`)
      return v
    }
    if (arg === '--format') format = value()
    else if (arg === '--pace') {
      const raw = value()
      pace = Number(raw)
      if (raw.trim() === '' || !Number.isFinite(pace)) throw new UsageError(`--pace must be a number of words a minute (got "${raw}")`)
    } else if (arg === '--names') {
      const v = value()
      if (v !== 'words' && v !== 'coords') throw new UsageError(`--names must be words or coords (got "${v}")`)
      names = v
    } else if (arg.startsWith('--')) throw new UsageError(`unknown option ${arg}`)
    else if (file === undefined) file = arg
    else throw new UsageError(`unexpected argument ${arg}`)
  }
  if (file === undefined) throw new UsageError('no puzzle given')
  if (!(format in FORMATS)) throw new UsageError(`--format must be one of ${Object.keys(FORMATS).join(', ')} (got "${format}")`)
  return { file, format, pace, names }
}

function readInput(file: string): unknown {
  let text: string
  try {
    text = file === '-' ? readFileSync(0, 'utf8') : readFileSync(file, 'utf8')
  } catch (e) {
    throw new UsageError(`can't read ${file === '-' ? 'standard input' : file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`)
  }
  const trimmed = text.trim()
  // Our puzzle files are JSON; a bare 81-character givens string is accepted as the engine does.
  if (trimmed.startsWith('{')) {
    try {
      return JSON.parse(trimmed)
    } catch (e) {
      throw new UsageError(`${file === '-' ? 'standard input' : file} is not valid JSON: ${(e as Error).message}`)
    }
  }
  return trimmed
}

function main(): number {
  try {
    const args = parseArgs(process.argv.slice(2))
    const input = readInput(args.file)
    const { puzzle, errors } = parsePuzzle(input)
    if (!puzzle) throw new UsageError(`invalid puzzle:\n${errors.map((e) => `  ${e.message}`).join('\n')}`)
    const result = solvePath(input)
    if (result.status === 'invalid') {
      throw new UsageError(`invalid puzzle:\n${(result.errors ?? []).map((e) => `  ${e.message}`).join('\n')}`)
    }
    const link = typeof input === 'object' && input !== null && typeof (input as { link?: unknown }).link === 'string' ? (input as { link: string }).link : undefined
    const outline = buildOutline(puzzle, result, { pace: args.pace, names: args.names, link })
    process.stdout.write(FORMATS[args.format](outline))
    return 0
  } catch (e) {
    process.stderr.write(`outline: ${(e as Error).message}\n`)
    if (e instanceof UsageError) process.stderr.write(`${USAGE}\n`)
    // Every failure here is about the input (puzzle, path or options): exit 2, as the contract says.
    return 2
  }
}

process.exitCode = main()
