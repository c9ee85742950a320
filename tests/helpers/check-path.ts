/** Soundness checks of a solve path against a known solution (from the SAT oracle). */
import { cellName, stateAt, type Puzzle, type Step } from '../../shared/engine/index'

/** Every way the steps disagree with the solution; empty when the path is sound. */
export function soundnessProblems(puzzle: Puzzle, steps: Step[], solution: string): string[] {
  const problems: string[] = []
  steps.forEach((step, k) => {
    const before = stateAt(puzzle, steps, k)
    for (const p of step.placements) {
      if (String(p.digit) !== solution[p.cell]) problems.push(`step ${k + 1} (${step.technique}) places ${p.digit} in ${cellName(p.cell)}, solution has ${solution[p.cell]}`)
      if (!(before.candidates[p.cell] & (1 << (p.digit - 1)))) problems.push(`step ${k + 1} places ${p.digit} in ${cellName(p.cell)}, which was not a candidate`)
    }
    for (const e of step.eliminations) {
      if (e.digits.includes(Number(solution[e.cell]))) problems.push(`step ${k + 1} (${step.technique}) removes the solution digit ${solution[e.cell]} from ${cellName(e.cell)}`)
      for (const d of e.digits) if (!(before.candidates[e.cell] & (1 << (d - 1)))) problems.push(`step ${k + 1} removes ${d} from ${cellName(e.cell)}, which was not a candidate`)
    }
    if (!step.placements.length && !step.eliminations.length) problems.push(`step ${k + 1} changes nothing`)
  })
  const end = stateAt(puzzle, steps, steps.length)
  for (let c = 0; c < 81; c++) {
    const d = Number(solution[c])
    if (end.digits[c] && end.digits[c] !== d) problems.push(`end: ${cellName(c)} holds ${end.digits[c]}, solution ${d}`)
    if (!(end.candidates[c] & (1 << (d - 1)))) problems.push(`end: ${cellName(c)} lost its solution digit ${d}`)
  }
  return problems
}
