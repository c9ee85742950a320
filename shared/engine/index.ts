/** Gridcue's deduction engine: parse and validate puzzles, find a human-style solve path, replay it. */
export type {
  Cell,
  ChainLink,
  Digit,
  Elimination,
  GridState,
  HouseKind,
  HouseRef,
  Placement,
  Puzzle,
  SolveResult,
  Step,
  StepFacts,
  TechniqueId,
  ValidationError,
} from './types'
export { cellName, parseCellName, houseName, gridString } from '../grid'
export { TECHNIQUES, type TechniqueInfo } from './techniques/catalog'
export { parsePuzzle } from './parse'
export { validatePuzzle, countSolutions } from './validate'
export { solvePath } from './solve-path'
export { stateAt } from './replay'
