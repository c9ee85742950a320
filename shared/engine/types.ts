/**
 * The engine's own records: a parsed puzzle, validation errors, a solve result, a replayed grid.
 * A step and its parts are defined once, as zod schemas in shared/schemas/step.ts; the engine
 * takes their types from there and hands them on, so its modules import all vocabulary from here.
 */
import type { Cell } from '../grid'
import type { Step } from '../schemas/step'

export type { Cell, Digit, HouseRef } from '../grid'
export type { ChainLink, Elimination, FactsKind, FactsOf, Step, StepFacts, TechniqueId } from '../schemas/step'

/** A puzzle after parsing: givens as digits (0 = empty), thermometers as cell paths, bulb first. */
export interface Puzzle {
  title: string
  author?: string
  givens: Uint8Array | number[]
  thermometers: Cell[][]
}

export interface ValidationError {
  code:
    | 'malformed'
    | 'givens-length'
    | 'givens-character'
    | 'duplicate-given'
    | 'thermometer-too-short'
    | 'thermometer-too-long'
    | 'thermometer-repeated-cell'
    | 'thermometer-not-adjacent'
    | 'thermometer-bad-cell'
    | 'thermometer-order'
    | 'no-solution'
    | 'multiple-solutions'
  message: string
  cells: Cell[]
}

export interface SolveResult {
  status: 'solved' | 'stuck' | 'invalid'
  steps: Step[]
  /** 81 chars, '.' where still empty */
  grid: string
  difficulty: number
  errors?: ValidationError[]
}

export interface GridState {
  /** 0 = empty */
  digits: Uint8Array
  /** bit (d - 1) set when d is still a candidate */
  candidates: Uint16Array
  /** cells showing pencil marks at this point */
  marks: Cell[]
  /** true for cells that were given */
  givens: Uint8Array
}
