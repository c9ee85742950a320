/**
 * Engine benchmark (not a test): per-corpus medians of the full solve path and of the uniqueness
 * check, the SAT oracle (logic-solver) timed on the same puzzles in the same run, technique use
 * per corpus, replay cost, heap over 10,000 solves, and the three-tier table of issue #12 (easy,
 * medium, hard thermometer puzzles from tests/fixtures/thermo-tiers.json) with every step
 * replayed against the oracle's solution. Run with `npm run bench:engine`.
 *
 * Options: `--tiers` prints the tier table alone; `--engine=<path to an engine index.ts>` runs it
 * on another copy of the engine (for before/after figures), which is imported instead of ours.
 */
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { pathToFileURL } from 'node:url'
import { setFlagsFromString } from 'node:v8'
import { runInNewContext } from 'node:vm'
import type { Puzzle, Step, TechniqueId } from '../shared/engine/index'
import { generateThermo } from '../tests/helpers/generate-thermo'
import { oracleSolve } from '../tests/helpers/sat-oracle'
import { TIERS, type TierSet } from '../tests/helpers/thermo-tiers'

const args = process.argv.slice(2)
const tiersOnly = args.includes('--tiers')
const enginePath = args.find((a) => a.startsWith('--engine='))?.slice('--engine='.length)
type Engine = typeof import('../shared/engine/index')
const engine: Engine = enginePath ? ((await import(pathToFileURL(resolve(enginePath)).href)) as Engine) : await import('../shared/engine/index')
const { countSolutions, parseCellName, parsePuzzle, solvePath, stateAt } = engine

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
const fresh = tiersOnly ? [] : Array.from({ length: 30 }, (_, i) => generateThermo(5000 + i)).map((g) => ({ id: `seed ${g.seed}`, title: g.title, givens: g.givens, thermometers: g.thermometers }))

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

console.log(`Gridcue engine benchmark (medians over puzzles; each puzzle timed as the median of its repeats)${enginePath ? `; engine: ${enginePath}` : ''}\n`)
if (!tiersOnly) for (const [name, list] of corpora) {
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
if (!tiersOnly) {
  const longest = [...thermo, ...fresh].map((e) => ({ e, r: solvePath(e) })).sort((a, b) => b.r.steps.length - a.r.steps.length)[0]
  const puzzle = parsePuzzle(longest.e).puzzle as Puzzle
  const n = longest.r.steps.length
  const t = time(() => stateAt(puzzle, longest.r.steps, n), 200)
  console.log(`== Replay: stateAt after all ${n} steps of ${longest.e.id}: median ${ms(t)}\n`)
}

// Memory: heap after 1,000 and after 10,000 solves (with a forced collection before each reading)
if (!tiersOnly) {
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

// Engine tiers (issue #12): easy, medium and hard puzzles defined without the engine (see
// tests/helpers/thermo-tiers.ts); every step replayed against the SAT oracle's solution.
{
  const set = JSON.parse(readFileSync(new URL('../tests/fixtures/thermo-tiers.json', import.meta.url), 'utf8')) as TierSet
  /** a what-if is "long" when its chain has more than this many links, unless the facts say so themselves */
  const LONG_LINKS = 6
  // nearest rank: the smallest value with at least q of the values at or below it
  const quantile = (xs: number[], q: number) => [...xs].sort((a, b) => a - b)[Math.max(0, Math.ceil(q * xs.length) - 1)]
  const spread = (xs: number[], f: (x: number) => string = String) => (xs.length ? `${f(median(xs))} (${f(Math.max(...xs))})` : '–')
  const fixed = (x: number) => (Number.isInteger(x) ? String(x) : x.toFixed(1))
  const t = (x: number) => (x < 1 ? x.toFixed(3) : x < 100 ? x.toFixed(2) : x.toFixed(0))
  const unsoundSteps = (steps: Step[], solution: string) =>
    steps.filter((s) => s.placements.some((p) => String(p.digit) !== solution[p.cell]) || s.eliminations.some((e) => e.digits.includes(Number(solution[e.cell])))).length
  const isLong = (s: Step) => {
    if (s.facts.kind !== 'contradiction') return false
    const flag = (s.facts as { long?: unknown }).long
    return typeof flag === 'boolean' ? flag : s.facts.chain.length > LONG_LINKS
  }
  for (const p of set.tiers.easy.slice(0, 5)) solvePath(p) // warm-up on puzzles of the tier kind
  const rows: string[] = []
  const shares: string[] = []
  const worstLines: string[] = []
  const all = { path: [] as number[], unique: [] as number[], unsound: 0 }
  const byTier: Record<string, { contra: number[]; long: number[]; path: number[]; solved: number }> = {}
  for (const tier of TIERS) {
    const list = set.tiers[tier]
    const status: Record<string, number> = { solved: 0, stuck: 0 }
    const stepCounts: number[] = []
    const contra: number[] = []
    const links: number[] = []
    const long: number[] = []
    const path: number[] = []
    const sat: number[] = []
    const unique: number[] = []
    const counts: Partial<Record<TechniqueId, number>> = {}
    let unsound = 0
    let wrongEnd = 0
    const ids: string[] = []
    for (const e of list) {
      ids.push(e.id)
      const puzzle = parsePuzzle(e).puzzle as Puzzle
      const cells = e.thermometers.map((th) => th.map((n) => parseCellName(n) as number))
      const r = solvePath(e)
      path.push(time(() => solvePath(e), 3))
      unique.push(time(() => countSolutions(puzzle), 5))
      const t0 = performance.now()
      const o = oracleSolve(e.givens, cells)
      sat.push(performance.now() - t0)
      if (o.count !== 1 || !o.solution) throw new Error(`${e.id}: the oracle finds ${o.count} solutions`)
      status[r.status] = (status[r.status] ?? 0) + 1
      stepCounts.push(r.steps.length)
      unsound += unsoundSteps(r.steps, o.solution)
      if (r.status === 'solved' && r.grid !== o.solution) wrongEnd++
      const what = r.steps.filter((s) => s.technique === 'contradiction')
      contra.push(what.length)
      long.push(what.filter(isLong).length)
      for (const s of what) if (s.facts.kind === 'contradiction') links.push(s.facts.chain.length)
      for (const s of r.steps) counts[s.technique] = (counts[s.technique] ?? 0) + 1
    }
    const steps = stepCounts.reduce((a, b) => a + b, 0)
    all.path.push(...path)
    all.unique.push(...unique)
    all.unsound += unsound + wrongEnd
    byTier[tier] = { contra, long, path, solved: status.solved }
    rows.push(
      `| ${tier} | ${list.length} | ${status.solved} / ${status.stuck}${status.invalid ? ` (+${status.invalid} invalid)` : ''} | ${spread(stepCounts)} | ${spread(contra, fixed)} | ${spread(links, fixed)} | ${spread(long, fixed)} | ${unsound}${wrongEnd ? ` (+${wrongEnd} wrong grids)` : ''} | ${t(median(path))} / ${t(quantile(path, 0.9))} / ${t(Math.max(...path))} | ${t(median(sat))} / ${t(quantile(sat, 0.9))} / ${t(Math.max(...sat))} | ${t(median(unique))} |`,
    )
    const worst = (xs: number[]) => ids[xs.indexOf(Math.max(...xs))]
    worstLines.push(`  ${tier}: most what-ifs ${Math.max(...contra) ? `${worst(contra)} (${Math.max(...contra)})` : 'none'}, slowest path ${worst(path)} (${t(Math.max(...path))} ms)`)
    shares.push(`  ${tier} (${steps} steps): ${Object.entries(counts).sort((a, b) => b[1] - a[1]).map(([k, v]) => `${k} ${((100 * v) / steps).toFixed(1)}%`).join(', ')}`)
  }
  const [first, last] = set.source.seedsScanned
  console.log(`${tiersOnly ? '' : '\n'}== Engine tiers (issue #12): tests/fixtures/thermo-tiers.json, ${set.source.perTier} puzzles a tier from seeds ${first}-${last}${enginePath ? `; engine: ${enginePath}` : ''}`)
  console.log('Per puzzle: steps, what-if (contradiction) steps, long what-ifs (chain > 6 links); chain links per what-if step; unsound = steps that place a wrong digit or remove the solution digit (oracle replay); times in ms, path = median of 3 runs, oracle = one solve + uniqueness, p90 by nearest rank.\n')
  console.log('| tier | puzzles | solved / stuck | steps median (max) | what-ifs a puzzle median (max) | chain links median (max) | long what-ifs a puzzle median (max) | unsound steps | path ms median / p90 / max | SAT oracle ms median / p90 / max | uniqueness ms median |')
  console.log('| --- | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: | ---: |')
  for (const row of rows) console.log(row)
  console.log('\nShare of steps per technique:')
  for (const line of shares) console.log(line)
  console.log('Worst puzzles:')
  for (const line of worstLines) console.log(line)
  const { easy, medium, hard } = byTier
  const check = (ok: boolean, what: string) => console.log(`  ${ok ? 'met    ' : 'NOT MET'} ${what}`)
  console.log(`\nTargets (solved: easy ${easy.solved}, medium ${medium.solved}, hard ${hard.solved}; must not fall below the "before" run):`)
  check(Math.max(...easy.contra) === 0, `easy: 0 what-ifs on every puzzle (max ${Math.max(...easy.contra)})`)
  check(median(medium.contra) === 0, `medium: median 0 what-ifs (${fixed(median(medium.contra))})`)
  check(median(hard.contra) <= 3 && Math.max(...hard.contra) <= 15, `hard: median ≤ 3 and max ≤ 15 what-ifs (${fixed(median(hard.contra))}, ${Math.max(...hard.contra)})`)
  check(median(hard.long) <= 1, `hard: median ≤ 1 long what-if (${fixed(median(hard.long))})`)
  check(all.unsound === 0, `0 unsound steps over all tiers (${all.unsound})`)
  check(median(all.path) <= 3, `full path median ≤ 3 ms over all tiers (${t(median(all.path))} ms)`)
  check(quantile(hard.path, 0.9) <= 20 && Math.max(...hard.path) <= 100, `hard: path p90 ≤ 20 ms, worst ≤ 100 ms (${t(quantile(hard.path, 0.9))}, ${t(Math.max(...hard.path))} ms)`)
  check(median(all.unique) <= 0.1, `uniqueness check median ≤ 0.1 ms over all tiers (${t(median(all.unique))} ms)`)
}
