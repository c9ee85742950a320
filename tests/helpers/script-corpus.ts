/**
 * Long scripts for the narration checks: the hard tier of tests/fixtures/thermo-tiers.json (made by
 * tests/helpers/thermo-tiers.ts, minimal givens and five or more thermometers), solved by the engine
 * and told in both naming styles, with the grid as it stands before each step.
 */
import { readFileSync } from 'node:fs'
import { parsePuzzle, solvePath, stateAt, type Puzzle, type Step } from '../../shared/engine/index'
import { buildOutline, type Outline } from '../../shared/script/index'

interface TierFile {
  tiers: Record<'easy' | 'medium' | 'hard', { id: string; title: string; givens: string; thermometers: string[][] }[]>
}

export interface CorpusScript {
  id: string
  puzzle: Puzzle
  steps: Step[]
  words: Outline
  coords: Outline
  /** digits and candidates just before step k (replayed by the engine's own board) */
  before: (k: number) => { digits: ArrayLike<number>; candidates: ArrayLike<number> }
}

export function hardScripts(): CorpusScript[] {
  const file = JSON.parse(readFileSync(new URL('../fixtures/thermo-tiers.json', import.meta.url), 'utf8')) as TierFile
  return file.tiers.hard.map((p) => {
    const parsed = parsePuzzle({ title: p.title, givens: p.givens, thermometers: p.thermometers })
    if (!parsed.puzzle) throw new Error(`${p.id} does not parse`)
    const puzzle = parsed.puzzle
    const result = solvePath(puzzle)
    const states = new Map<number, { digits: ArrayLike<number>; candidates: ArrayLike<number> }>()
    const before = (k: number) => {
      let s = states.get(k)
      if (!s) {
        const state = stateAt(puzzle, result.steps, k)
        s = { digits: Array.from(state.digits), candidates: Array.from(state.candidates) }
        states.set(k, s)
      }
      return s
    }
    return {
      id: p.id,
      puzzle,
      steps: result.steps,
      words: buildOutline(puzzle, result, { names: 'words' }),
      coords: buildOutline(puzzle, result, { names: 'coords' }),
      before,
    }
  })
}
