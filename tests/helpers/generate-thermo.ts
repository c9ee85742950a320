/**
 * Our own generator of sudoku-with-thermometer puzzles, seeded so every puzzle can be made again:
 * a random full grid, thermometers that rise along it on king-adjacent paths, givens added at a
 * cell where two solutions still differ until the solution is unique, then (optionally) givens
 * removed again while it stays unique.
 */
import { validatePuzzle } from '../../shared/engine/index'
import { cellName, gridString, kingAdjacent } from '../../shared/grid'

export interface GeneratedPuzzle {
  seed: number
  title: string
  givens: string
  thermometers: string[][]
  solution: string
}

export interface GenerateOptions {
  /** number of thermometers (default 3–6 at random) */
  thermometers?: number
  minLength?: number
  maxLength?: number
  /** remove givens that are not needed for uniqueness (default true) */
  minimize?: boolean
  /** chance that a thermometer may run through a cell of another one (default 0.15) */
  shareChance?: number
}

/** A seeded pseudo-random source in [0, 1) (mulberry32). */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** A uniquely solvable thermometer puzzle made from a seed. */
export function generateThermo(seed: number, options: GenerateOptions = {}): GeneratedPuzzle {
  const rnd = seededRandom(seed)
  const solution = randomGrid(rnd)
  const count = options.thermometers ?? 3 + Math.floor(rnd() * 4)
  const paths = randomThermometers(rnd, solution, count, options.minLength ?? 3, options.maxLength ?? 7, options.shareChance ?? 0.15)
  const thermometers = paths.map((p) => p.map(cellName))
  const givens = uniqueGivens(rnd, solution, thermometers, new Array<number>(81).fill(0), options.minimize ?? true)
  return { seed, title: `Generated thermometer puzzle, seed ${seed}`, givens: gridString(givens), thermometers, solution: solution.join('') }
}

/** A full random solution grid (81 digits) from a seed. */
export function randomSolution(seed: number): number[] {
  return randomGrid(seededRandom(seed))
}

/**
 * Adds givens from `solution` (never on `keepOpen` cells) until the puzzle is unique, then
 * optionally removes those not needed; starts from `start` (0 = empty) and keeps its givens.
 */
export function uniqueGivens(rnd: () => number, solution: number[], thermometers: string[][], start: number[], minimize: boolean, keepOpen: ReadonlySet<number> = new Set()): number[] {
  const givens = start.slice()
  const fixed = new Set(start.map((d, c) => (d ? c : -1)).filter((c) => c >= 0))
  const asPuzzle = () => ({ title: 'generated', givens: gridString(givens), thermometers })
  for (;;) {
    const errors = validatePuzzle(asPuzzle())
    if (!errors.length) break
    const witness = errors[0].code === 'multiple-solutions' ? errors[0].cells.filter((c) => !keepOpen.has(c)) : []
    if (!witness.length) {
      // both witness cells must stay open: fix some other open cell at random instead
      const open = givens.map((d, c) => (d || keepOpen.has(c) ? -1 : c)).filter((c) => c >= 0)
      if (errors[0].code !== 'multiple-solutions' || !open.length) throw new Error(`uniqueGivens: ${errors[0].message}`)
      witness.push(open[Math.floor(rnd() * open.length)])
    }
    const cell = witness[Math.floor(rnd() * witness.length)]
    givens[cell] = solution[cell]
  }
  if (minimize) {
    const order = shuffle(rnd, givens.map((d, c) => (d && !fixed.has(c) ? c : -1)).filter((c) => c >= 0))
    for (const c of order) {
      givens[c] = 0
      if (validatePuzzle(asPuzzle()).length) givens[c] = solution[c]
    }
  }
  return givens
}

function randomGrid(rnd: () => number): number[] {
  const grid = new Array<number>(81).fill(0)
  const used = new Uint16Array(27)
  const fill = (cell: number): boolean => {
    if (cell === 81) return true
    const r = Math.floor(cell / 9)
    const c = cell % 9
    const b = 3 * Math.floor(r / 3) + Math.floor(c / 3)
    for (const d of shuffle(rnd, [1, 2, 3, 4, 5, 6, 7, 8, 9])) {
      const bit = 1 << d
      if ((used[r] | used[9 + c] | used[18 + b]) & bit) continue
      used[r] |= bit
      used[9 + c] |= bit
      used[18 + b] |= bit
      grid[cell] = d
      if (fill(cell + 1)) return true
      used[r] &= ~bit
      used[9 + c] &= ~bit
      used[18 + b] &= ~bit
    }
    grid[cell] = 0
    return false
  }
  fill(0)
  return grid
}

function randomThermometers(rnd: () => number, solution: number[], count: number, minLength: number, maxLength: number, shareChance: number): number[][] {
  const taken = new Set<number>()
  const out: number[][] = []
  for (let attempt = 0; out.length < count && attempt < 500; attempt++) {
    const target = minLength + Math.floor(rnd() * (maxLength - minLength + 1))
    const start = Math.floor(rnd() * 81)
    if (taken.has(start) || solution[start] > 10 - target) continue
    const path = [start]
    while (path.length < target) {
      const last = path[path.length - 1]
      const next = shuffle(rnd, neighbours(last)).filter(
        (n) => !path.includes(n) && solution[n] > solution[last] && (!taken.has(n) || rnd() < shareChance) && solution[n] <= 10 - target + path.length,
      )
      if (!next.length) break
      path.push(next[0])
    }
    if (path.length < minLength) continue
    path.forEach((c) => taken.add(c))
    out.push(path)
  }
  return out
}

/** Cells touching `cell` by a side or a corner, in reading order. */
function neighbours(cell: number): number[] {
  return Array.from({ length: 81 }, (_, c) => c).filter((c) => kingAdjacent(cell, c))
}

function shuffle<T>(rnd: () => number, list: T[]): T[] {
  const a = list.slice()
  for (let i = a.length - 1; i > 0; i--) {
    const j = Math.floor(rnd() * (i + 1))
    ;[a[i], a[j]] = [a[j], a[i]]
  }
  return a
}
