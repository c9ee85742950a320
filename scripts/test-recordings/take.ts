/**
 * A take to record: the visible lines of the outlines Gridcue writes for one or more fixture puzzles
 * (tests/fixtures), run through the engine and the script writer exactly as the server does.
 */
import { readFileSync } from 'node:fs'
import { parsePuzzle, solvePath } from '../../shared/engine/index'
import { buildOutline } from '../../shared/script/index'

export interface TakeLine {
  lineId: number
  text: string
}

interface FixturePuzzle {
  id: string
  title: string
  givens: string
  thermometers?: string[][]
}

const FIXTURES = ['classic-puzzles.json', 'thermo-puzzles.json'].flatMap(
  (name) => (JSON.parse(readFileSync(new URL(`../../tests/fixtures/${name}`, import.meta.url), 'utf8')) as { puzzles: FixturePuzzle[] }).puzzles,
)

/** One episode's script: the puzzles' visible lines one after another, numbered from 1. */
export function takeLines(puzzleIds: string[]): TakeLine[] {
  const texts = puzzleIds.flatMap((id) => {
    const entry = FIXTURES.find((p) => p.id === id)
    if (!entry) throw new Error(`no fixture puzzle ${id}`)
    const input = { title: entry.title, givens: entry.givens, thermometers: entry.thermometers ?? [] }
    const { puzzle } = parsePuzzle(input)
    if (!puzzle) throw new Error(`fixture ${id} does not parse`)
    return buildOutline(puzzle, solvePath(input), { names: 'words' }).lines.filter((l) => !l.hidden).map((l) => l.text)
  })
  return texts.map((text, i) => ({ lineId: i + 1, text }))
}
