/**
 * An independent oracle: sudoku plus thermometers encoded for the general SAT solver
 * `logic-solver` (npm). It shares no code with the engine, so agreement between the two is evidence.
 */
import Logic from 'logic-solver'

export interface OracleResult {
  /** 0, 1, or 2 meaning "two or more" */
  count: number
  /** the first solution found, 81 digits */
  solution?: string
}

const v = (cell: number, d: number) => `c${cell}d${d}`

/** Solves and checks uniqueness: givens as 81 chars ('.' or '0' empty), thermometers as 0-based cell paths, bulb first. */
export function oracleSolve(givens: string, thermometers: number[][] = []): OracleResult {
  const solver = new Logic.Solver()
  const units: number[][] = []
  for (let r = 0; r < 9; r++) units.push(Array.from({ length: 9 }, (_, c) => r * 9 + c))
  for (let c = 0; c < 9; c++) units.push(Array.from({ length: 9 }, (_, r) => r * 9 + c))
  for (let b = 0; b < 9; b++) units.push(Array.from({ length: 9 }, (_, i) => (3 * Math.floor(b / 3) + Math.floor(i / 3)) * 9 + 3 * (b % 3) + (i % 3)))
  for (let cell = 0; cell < 81; cell++) solver.require(Logic.exactlyOne(...[1, 2, 3, 4, 5, 6, 7, 8, 9].map((d) => v(cell, d))))
  for (const unit of units) for (let d = 1; d <= 9; d++) solver.require(Logic.exactlyOne(...unit.map((cell) => v(cell, d))))
  for (let cell = 0; cell < 81; cell++) {
    const ch = givens[cell]
    if (ch >= '1' && ch <= '9') solver.require(v(cell, Number(ch)))
  }
  // strictly rising along each thermometer: forbid every pair (a, b) with a >= b on neighbouring cells
  for (const path of thermometers) {
    for (let i = 1; i < path.length; i++) {
      for (let a = 1; a <= 9; a++) for (let b = 1; b <= a; b++) solver.forbid(Logic.and(v(path[i - 1], a), v(path[i], b)))
    }
  }
  const first = solver.solve()
  if (!first) return { count: 0 }
  const solution = readSolution(first.getTrueVars() as string[])
  solver.forbid(first.getFormula())
  return { count: solver.solve() ? 2 : 1, solution }
}

function readSolution(trueVars: string[]): string {
  const digits = new Array<number>(81).fill(0)
  for (const name of trueVars) {
    const m = /^c(\d+)d(\d)$/.exec(name)
    if (m) digits[Number(m[1])] = Number(m[2])
  }
  return digits.join('')
}
