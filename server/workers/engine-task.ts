/**
 * The engine's work for the API, one export per piscina task name. It runs inside the worker
 * pool (see engine-pool.ts) so a long solve never blocks the request thread; the demo seed
 * calls the same functions directly.
 */
import { countSolutions, parsePuzzle, solvePath, validatePuzzle, type ValidationError } from '../../shared/engine/index'
import { buildOutline } from '../../shared/script/index'
import type { NamingStyle, Outline } from '../../shared/schemas/outline'
import type { PuzzleCheck, PuzzleRecord } from '../../shared/schemas/studio'

/** A puzzle as stored: givens of 1-9 or '.', thermometers as cell-name paths. */
export interface PuzzleInput {
  title: string
  author?: string
  givens: string
  thermometers: string[][]
}

export interface PuzzleVerdict {
  check: PuzzleCheck
  problems: PuzzleRecord['problems']
  /** 81 digits when the check is 'unique' */
  solution: string | null
}

export interface OutlineTask {
  puzzle: PuzzleInput
  pace?: number
  names?: NamingStyle
  link?: string
}

/** Whether the puzzle is well formed and has exactly one solution, with the engine's messages when not. */
export function check(puzzle: PuzzleInput): PuzzleVerdict {
  const parsed = parsePuzzle(puzzle)
  if (!parsed.puzzle) return { check: 'invalid', problems: parsed.errors.map(toProblem), solution: null }
  const { count, solution } = countSolutions(parsed.puzzle, 2)
  if (count === 1 && solution) return { check: 'unique', problems: [], solution }
  // solved again only on this rarer path, for messages that name cells where solutions differ
  return { check: count === 0 ? 'no-solution' : 'multiple-solutions', problems: validatePuzzle(puzzle).map(toProblem), solution: null }
}

/** Why no outline could be made, said to the person who asked for one (errors don't cross the thread boundary typed). */
export interface NoOutline {
  refused: string
}

/** A solve path narrated as a timed outline; a path that gets stuck is still an outline (status 'stuck'). */
export function outline(task: OutlineTask): Outline | NoOutline {
  const { puzzle, errors } = parsePuzzle(task.puzzle)
  if (!puzzle) return { refused: `The puzzle can't be solved: ${errors[0]?.message ?? 'it is malformed'}` }
  const result = solvePath(puzzle)
  if (result.status === 'invalid') return { refused: `The puzzle can't be solved: ${result.errors?.[0]?.message ?? 'the engine rejected it'}` }
  if (result.steps.length === 0) {
    return { refused: "Gridcue's engine can't find a first step in this puzzle: it needs a technique the engine doesn't know yet, so there is no path to script." }
  }
  return buildOutline(puzzle, result, { pace: task.pace, names: task.names, link: task.link })
}

const toProblem = (e: ValidationError) => ({ code: e.code, message: e.message, cells: [...e.cells] })
