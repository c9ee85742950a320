/** What the grid shows at one position of a take: the same picture in the studio, on the episode page and in PNGs. */
import { stateAt } from '../engine/replay'
import type { Puzzle, Step } from '../engine/types'
import type { HouseRef } from '../grid'
import type { Outline } from '../schemas/outline'

/** Everything the grid draws at one position (GridBoard's props, and gridSvg's input). */
export interface BoardPicture {
  /** 81 digits, 0 = empty */
  digits: Uint8Array
  /** 81 flags, 1 = given */
  givens: Uint8Array
  /** cell paths, bulb first */
  thermometers: number[][]
  /** 81 nine-bit masks (bit d − 1 = digit d), shown only in the cells listed in `marks` */
  candidates: Uint16Array
  marks: number[]
  focus: number[]
  reasonCells: number[]
  reasonHouses: HouseRef[]
  reasonThermometers: number[]
  /** candidates the step removes (struck through) */
  eliminated: { cell: number; digits: number[] }[]
  /** cells the step places */
  placed: number[]
  /** contradiction chain, cells in order */
  chain: number[]
}

/**
 * The grid after step k (0 = the givens; k is clamped to the path) with that step's focus, reasons, eliminations,
 * placements and contradiction chain. State is rebuilt from the givens each time: the engine's replay costs microseconds.
 */
export function boardAt(outline: Pick<Outline, 'puzzle' | 'steps' | 'status'>, k: number): BoardPicture {
  const steps: readonly Step[] = outline.steps
  const at = Math.min(Math.max(Math.trunc(k) || 0, 0), steps.length)
  const puzzle: Puzzle = {
    title: '',
    givens: Array.from(outline.puzzle.givens, (ch) => (ch === '.' ? 0 : Number(ch))),
    thermometers: outline.puzzle.thermometers,
  }
  const state = stateAt(puzzle, steps, at)
  const step = at > 0 ? steps[at - 1] : undefined
  const atStop = outline.status === 'stuck' && at === steps.length
  const empty: number[] = []
  if (atStop) for (let c = 0; c < 81; c++) if (!state.digits[c]) empty.push(c)
  return {
    digits: state.digits,
    givens: state.givens,
    thermometers: outline.puzzle.thermometers,
    candidates: state.candidates,
    // Where the engine stopped, every empty cell shows what is left: that is where a person takes over.
    marks: atStop ? empty : state.marks,
    focus: step?.focus ?? [],
    reasonCells: step?.reason.cells ?? [],
    reasonHouses: step?.reason.houses ?? [],
    reasonThermometers: step?.reason.thermometers ?? [],
    eliminated: step?.eliminations ?? [],
    placed: step?.placements.map((pl) => pl.cell) ?? [],
    chain: step?.facts.kind === 'contradiction' ? [step.facts.cell, ...step.facts.chain.map((link) => link.cell)] : [],
  }
}
