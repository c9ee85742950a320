/**
 * A three-tier set of thermometer puzzles for the engine benchmark (issue #12), defined without
 * the engine under test: a small propagator of our own (naked and hidden singles, thermometer
 * bounds) and an exact solution counter built on it decide the tiers, never the solve path.
 *
 * Per seed, from 90000 up, one ladder on one grid:
 * - the solution grid and thermometers of `generateThermo(seed, { minimize: false })` (its givens
 *   are not used; grid and thermometers are drawn before them);
 * - easy: start from all 81 digits and, in a seeded random order, remove each given whose removal
 *   still lets the propagator fill the whole grid; the result needs only singles and bounds, and
 *   removing any one more given breaks that (propagation only weakens with fewer givens);
 * - hard: go on removing, in a new random order, every given whose removal keeps the solution
 *   unique; the result is minimal (no given can be removed keeping uniqueness). Hard needs 5 or
 *   more thermometers and at least one given removed beyond easy;
 * - medium: easy with the first half (rounded up) of those further removals, when there were at
 *   least two: unique, not solvable by singles and bounds alone, not minimal.
 * Each tier takes the first `TIER_SIZE` seeds that have a puzzle of that tier. The seeds were not
 * tuned: 90000 was picked before any puzzle was seen.
 */
import { generateThermo, seededRandom } from './generate-thermo'

const TIER_SEED_START = 90000
export const TIER_SIZE = 20
export const TIERS = ['easy', 'medium', 'hard'] as const
type Tier = (typeof TIERS)[number]

interface TierPuzzle {
  id: string
  seed: number
  title: string
  givens: string
  thermometers: string[][]
  solution: string
}

export interface TierSet {
  description: string
  source: { generator: string; seedStart: number; perTier: number; seedsScanned: [number, number]; ladderSeed: string }
  tiers: Record<Tier, TierPuzzle[]>
}

// Geometry of our own (the tier definition shares no code with the engine).
const HOUSES: number[][] = []
for (let r = 0; r < 9; r++) HOUSES.push(Array.from({ length: 9 }, (_, c) => r * 9 + c))
for (let c = 0; c < 9; c++) HOUSES.push(Array.from({ length: 9 }, (_, r) => r * 9 + c))
for (let b = 0; b < 9; b++) HOUSES.push(Array.from({ length: 9 }, (_, i) => (3 * Math.floor(b / 3) + Math.floor(i / 3)) * 9 + 3 * (b % 3) + (i % 3)))
const PEERS: number[][] = Array.from({ length: 81 }, (_, cell) => [...new Set(HOUSES.filter((h) => h.includes(cell)).flat())].filter((p) => p !== cell))
const ALL = 0x1ff
const bits = (m: number) => {
  let n = 0
  for (; m; m &= m - 1) n++
  return n
}
const lowest = (m: number) => 31 - Math.clz32(m & -m) + 1
const highest = (m: number) => 31 - Math.clz32(m) + 1
/** digits strictly above d (d = 0: all) and strictly below d (d = 10: all) as masks */
const above = (d: number) => (ALL << d) & ALL
const below = (d: number) => (1 << (d - 1)) - 1

/**
 * Singles and thermometer bounds to a fixpoint, in place; false when a cell or a house runs out
 * of options. Bounds: each thermometer cell above the smallest option of the cell before it and
 * below the largest option of the cell after it (which also covers the length rule).
 */
function propagate(cand: Uint16Array, thermometers: readonly (readonly number[])[]): boolean {
  for (let changed = true; changed; ) {
    changed = false
    for (let c = 0; c < 81; c++) {
      const m = cand[c]
      if (!m) return false
      if (m & (m - 1)) continue
      for (const p of PEERS[c]) {
        if (cand[p] & m) {
          cand[p] &= ~m
          if (!cand[p]) return false
          changed = true
        }
      }
    }
    for (const house of HOUSES) {
      for (let d = 0; d < 9; d++) {
        const bit = 1 << d
        let place = -1
        let count = 0
        for (const c of house) {
          if (cand[c] & bit) {
            place = c
            count++
          }
        }
        if (!count) return false
        if (count === 1 && cand[place] !== bit) {
          cand[place] = bit
          changed = true
        }
      }
    }
    for (const t of thermometers) {
      let low = 0
      for (const c of t) {
        const m = cand[c] & above(low)
        if (!m) return false
        if (m !== cand[c]) {
          cand[c] = m
          changed = true
        }
        low = lowest(m)
      }
      let high = 10
      for (let i = t.length - 1; i >= 0; i--) {
        const c = t[i]
        const m = cand[c] & below(high)
        if (!m) return false
        if (m !== cand[c]) {
          cand[c] = m
          changed = true
        }
        high = highest(m)
      }
    }
  }
  return true
}

const startCandidates = (givens: ArrayLike<number>) => Uint16Array.from({ length: 81 }, (_, c) => (givens[c] ? 1 << (givens[c] - 1) : ALL))

/** True when singles and thermometer bounds alone fill the grid (which also proves it unique). */
export function solvedBySinglesAndBounds(givens: ArrayLike<number>, thermometers: readonly (readonly number[])[]): boolean {
  const cand = startCandidates(givens)
  return propagate(cand, thermometers) && cand.every((m) => bits(m) === 1)
}

/** Number of solutions, counted up to `limit`, by propagation and search on the tightest cell. */
export function countTierSolutions(givens: ArrayLike<number>, thermometers: readonly (readonly number[])[], limit = 2): number {
  let found = 0
  const search = (cand: Uint16Array) => {
    if (!propagate(cand, thermometers)) return
    let best = -1
    for (let c = 0; c < 81; c++) if (bits(cand[c]) > 1 && (best < 0 || bits(cand[c]) < bits(cand[best]))) best = c
    if (best < 0) {
      found++
      return
    }
    for (let m = cand[best]; m && found < limit; m &= m - 1) {
      const next = cand.slice()
      next[best] = m & -m
      search(next)
    }
  }
  search(startCandidates(givens))
  return found
}

const cellIndex = (name: string) => (Number(name[1]) - 1) * 9 + Number(name[3]) - 1
const asString = (givens: number[]) => givens.map((d) => (d ? String(d) : '.')).join('')

function shuffle<T>(rnd: () => number, list: T[]): T[] {
  const a = list.slice()
  for (let i = a.length - 1; i > 0; i--) {
    const j = Math.floor(rnd() * (i + 1))
    ;[a[i], a[j]] = [a[j], a[i]]
  }
  return a
}

/** The puzzles of each tier one seed gives (a tier is missing when the seed has none of it). */
function tierLadder(seed: number): Partial<Record<Tier, TierPuzzle>> {
  const g = generateThermo(seed, { minimize: false })
  const solution = [...g.solution].map(Number)
  const thermos = g.thermometers.map((t) => t.map(cellIndex))
  // a random source of the ladder's own, so the generator's sequence stays as it is
  const rnd = seededRandom(seed ^ 0x5eed)
  const givens = solution.slice()
  for (const c of shuffle(rnd, [...Array(81).keys()])) {
    givens[c] = 0
    if (!solvedBySinglesAndBounds(givens, thermos)) givens[c] = solution[c]
  }
  const easy = givens.slice()
  const removed: number[] = []
  for (const c of shuffle(rnd, [...Array(81).keys()].filter((c) => givens[c]))) {
    givens[c] = 0
    if (countTierSolutions(givens, thermos) === 1) removed.push(c)
    else givens[c] = solution[c]
  }
  const make = (tier: Tier, digits: number[]): TierPuzzle => ({
    id: `${tier}-${seed}`,
    seed,
    title: `Generated thermometer puzzle, seed ${seed}, ${tier} tier`,
    givens: asString(digits),
    thermometers: g.thermometers,
    solution: g.solution,
  })
  const out: Partial<Record<Tier, TierPuzzle>> = { easy: make('easy', easy) }
  if (removed.length >= 2) {
    const medium = easy.slice()
    for (const c of removed.slice(0, Math.ceil(removed.length / 2))) medium[c] = 0
    out.medium = make('medium', medium)
  }
  if (removed.length >= 1 && thermos.length >= 5) out.hard = make('hard', givens)
  return out
}

/** The whole tier set: the first `perTier` seeds from `seedStart` with a puzzle of each tier. */
export function buildTierSet(seedStart = TIER_SEED_START, perTier = TIER_SIZE): TierSet {
  const tiers: Record<Tier, TierPuzzle[]> = { easy: [], medium: [], hard: [] }
  let seed = seedStart
  for (; TIERS.some((t) => tiers[t].length < perTier); seed++) {
    const ladder = tierLadder(seed)
    for (const t of TIERS) if (ladder[t] && tiers[t].length < perTier) tiers[t].push(ladder[t])
  }
  return {
    description:
      'Three tiers of thermometer puzzles for the engine benchmark (issue #12), made by tests/helpers/thermo-tiers.ts and defined without the engine under test: easy = solvable by singles and thermometer bounds alone (a small propagator in the helper), no given removable keeping that; hard = minimal givens (no given removable keeping uniqueness) and 5 or more thermometers; medium = easy with the first half of the further removals towards minimal (unique, neither easy nor minimal). Each tier holds the first puzzles of its kind from the seeds scanned. Regenerated and checked in tests/shared/engine/tiers.test.ts.',
    source: {
      generator: 'tests/helpers/thermo-tiers.ts (grid and thermometers: generateThermo(seed, { minimize: false }) in tests/helpers/generate-thermo.ts)',
      seedStart,
      perTier,
      seedsScanned: [seedStart, seed - 1],
      ladderSeed: 'seededRandom(seed ^ 0x5eed)',
    },
    tiers,
  }
}
