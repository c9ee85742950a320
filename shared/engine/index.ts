/** Gridcue's deduction engine: parse and validate puzzles, find a human-style solve path, replay it. */
// The step's parts are in shared/schemas/step.ts and the grid's in shared/grid; import them from there.
export type { Puzzle, Step, TechniqueId, ValidationError } from './types'
export { cellName, parseCellName, houseName, gridString } from '../grid'
export { TECHNIQUES } from './techniques/catalog'
export { parsePuzzle } from './parse'
export { validatePuzzle, countSolutions } from './validate'
export { solvePath } from './solve-path'
export { stateAt } from './replay'
