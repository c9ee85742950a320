/**
 * Command line: `npm run --silent solve -- <puzzle.json | ->` prints the solve path as JSON.
 * Invalid puzzles still exit 0 (status "invalid" with errors); an unreadable file exits 2.
 */
import { readFileSync } from 'node:fs'
import { cellName, solvePath } from '../shared/engine/index'

function readInput(arg: string | undefined): string {
  if (!arg) throw new Error('usage: npm run --silent solve -- <puzzle.json | ->')
  return readFileSync(arg === '-' ? 0 : arg, 'utf8')
}

let text: string
try {
  text = readInput(process.argv[2])
} catch (e) {
  const err = e as NodeJS.ErrnoException
  process.stderr.write(`solve: cannot read ${process.argv[2] ?? 'input'}: ${err.message}\n`)
  process.exit(2)
}

const result = solvePath(text)
const output: Record<string, unknown> = {
  status: result.status,
  steps: result.steps.map((s) => ({
    technique: s.technique,
    placements: s.placements.map((p) => ({ cell: cellName(p.cell), digit: p.digit })),
    eliminations: s.eliminations.map((e) => ({ cell: cellName(e.cell), digits: e.digits })),
    text: s.text,
  })),
  grid: result.grid,
}
if (result.errors) output.errors = result.errors.map((e) => ({ code: e.code, message: e.message, cells: e.cells.map(cellName) }))
process.stdout.write(JSON.stringify(output, null, 2) + '\n')
