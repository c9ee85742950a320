/**
 * Engine benchmark (not a test): per-corpus medians of the full solve path and of the uniqueness
 * check, the SAT oracle (logic-solver) timed on the same puzzles in the same run, technique use
 * per corpus, replay cost, and heap over 10,000 solves. Run with `npm run bench:engine`.
 */
import { readFileSync } from 'node:fs'
import { setFlagsFromString } from 'node:v8'
import { runInNewContext } from 'node:vm'
import { countSolutions, parseCellName, parsePuzzle, solvePath, stateAt, type Puzzle, type TechniqueId } from '../shared/engine/index'
import { generateThermo } from '../tests/helpers/generate-thermo'
import { oracleSolve } from '../tests/helpers/sat-oracle'

interface Entry {
  id: string
  title: string
  givens: string
  thermometers: string[][]
}
const load = (name: string) => (JSON.parse(readFileSync(new URL(`../tests/fixtures/${name}`, import.meta.url), 'utf8')) as { puzzles: Entry[] }).puzzles
const classic = load('classic-puzzles.json').filter((p) => p.id.startsWith('PE')).map((p) => ({ ...p, thermometers: [] }))
const thermo = load('thermo-puzzles.json')
// Fresh puzzles the engine was never tuned on: our generator with seeds outside the fixture set.
const fresh = Array.from({ length: 30 }, (_, i) => generateThermo(5000 + i)).map((g) => ({ id: `seed ${g.seed}`, title: g.title, givens: g.givens, thermometers: g.thermometers }))

const corpora: [string, Entry[]][] = [
  ['Project Euler 96 (50 classic)', classic],
  ['Thermometer fixtures (16, 10-21 givens)', thermo],
  ['Fresh generated thermometer puzzles (30, seeds 5000-5029)', fresh],
]

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b)
  return s.length % 2 ? s[s.length >> 1] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2
}
const time = (fn: () => void, reps: number) => {
  const t: number[] = []
  for (let i = 0; i < reps; i++) {
    const t0 = performance.now()
    fn()
    t.push(performance.now() - t0)
  }
  return median(t)
}
const ms = (x: number) => (x < 1 ? x.toFixed(3) : x.toFixed(2)) + ' ms'

// warm-up so the first corpus is not charged for compilation
for (const p of classic.slice(0, 10)) solvePath(p.givens)

console.log('Gridcue engine benchmark (medians over puzzles; each puzzle timed as the median of its repeats)\n')
for (const [name, list] of corpora) {
  const puzzles = list.map((e) => ({ e, puzzle: parsePuzzle(e).puzzle as Puzzle, cells: e.thermometers.map((t) => t.map((n) => parseCellName(n) as number)) }))
  const path = puzzles.map(({ e }) => time(() => solvePath(e), 3))
  const unique = puzzles.map(({ puzzle }) => time(() => countSolutions(puzzle), 5))
  const sat = puzzles.map(({ e, cells }) => time(() => oracleSolve(e.givens, cells), 1))
  const counts: Partial<Record<TechniqueId, number>> = {}
  const status: Record<string, number> = {}
  let steps = 0
  for (const { e } of puzzles) {
    const r = solvePath(e)
    status[r.status] = (status[r.status] ?? 0) + 1
    steps += r.steps.length
    for (const s of r.steps) counts[s.technique] = (counts[s.technique] ?? 0) + 1
  }
  console.log(`== ${name}`)
  console.log(`  status: ${Object.entries(status).map(([k, v]) => `${k} ${v}`).join(', ')}; ${steps} steps`)
  console.log(`  full path median ${ms(median(path))} (max ${ms(Math.max(...path))})`)
  console.log(`  uniqueness check median ${ms(median(unique))} (max ${ms(Math.max(...unique))})`)
  console.log(`  SAT oracle (solve + uniqueness) median ${ms(median(sat))}`)
  console.log(`  ratio oracle / engine uniqueness check: ${(median(sat) / median(unique)).toFixed(0)}x; oracle / engine full path: ${(median(sat) / median(path)).toFixed(1)}x`)
  console.log(`  techniques: ${Object.entries(counts).sort((a, b) => b[1] - a[1]).map(([k, v]) => `${k} ${v}`).join(', ')}`)
  const contradictions = counts.contradiction ?? 0
  console.log(`  contradiction share: ${((100 * contradictions) / Math.max(1, steps)).toFixed(1)}% of steps\n`)
}

// Replay: the slider calls stateAt on every move
{
  const longest = [...thermo, ...fresh].map((e) => ({ e, r: solvePath(e) })).sort((a, b) => b.r.steps.length - a.r.steps.length)[0]
  const puzzle = parsePuzzle(longest.e).puzzle as Puzzle
  const n = longest.r.steps.length
  const t = time(() => stateAt(puzzle, longest.r.steps, n), 200)
  console.log(`== Replay: stateAt after all ${n} steps of ${longest.e.id}: median ${ms(t)}\n`)
}

// Memory: heap after 1,000 and after 10,000 solves (with a forced collection before each reading)
{
  setFlagsFromString('--expose_gc')
  const gc = runInNewContext('gc') as () => void
  const heap = () => {
    gc()
    gc()
    return process.memoryUsage().heapUsed / 1024 / 1024
  }
  const mix = [...classic, ...thermo]
  let solved = 0
  const run = (count: number) => {
    for (let i = 0; i < count; i++) if (solvePath(mix[(solved + i) % mix.length]).status === 'solved') void 0
    solved += count
  }
  run(1000)
  const after1k = heap()
  const t0 = performance.now()
  run(9000)
  const secs = (performance.now() - t0) / 1000
  const after10k = heap()
  console.log(`== Memory over 10,000 solves (Project Euler + thermometer fixtures, cycled)`)
  console.log(`  heap after 1,000: ${after1k.toFixed(1)} MB; after 10,000: ${after10k.toFixed(1)} MB; growth ${(after10k - after1k).toFixed(1)} MB (9,000 solves in ${secs.toFixed(1)} s)`)
}
