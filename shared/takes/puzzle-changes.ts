/**
 * What changed in a puzzle's grid since a take was made from it: the take keeps the givens and
 * thermometers it was solved on, the puzzle has moved on. Pure, so the server, the studio and the
 * puzzle page say the same thing.
 */
import { cellName } from '../grid/geometry'

/** A grid as a take stores it: 81 characters ('.' for empty) and thermometers as cell indices, bulb first. */
interface TakeGrid {
  givens: string
  thermometers: number[][]
}

export interface PuzzleChanges {
  givens: { added: number; removed: number; changed: number }
  thermometers: { added: number; removed: number }
}

const EMPTY = '.'

/** The differences from `made` (the take's grid) to `now` (the puzzle's), or null when the grids are the same. */
export function puzzleChanges(made: TakeGrid, now: TakeGrid): PuzzleChanges | null {
  const givens = { added: 0, removed: 0, changed: 0 }
  for (let cell = 0; cell < 81; cell++) {
    const before = made.givens[cell] ?? EMPTY
    const after = now.givens[cell] ?? EMPTY
    if (before === after) continue
    if (before === EMPTY) givens.added++
    else if (after === EMPTY) givens.removed++
    else givens.changed++
  }
  // a thermometer is its path: the same cells read the other way round is another thermometer
  const pathsBefore = new Set(made.thermometers.map(pathKey))
  const pathsAfter = new Set(now.thermometers.map(pathKey))
  const thermometers = {
    added: [...pathsAfter].filter((p) => !pathsBefore.has(p)).length,
    removed: [...pathsBefore].filter((p) => !pathsAfter.has(p)).length,
  }
  const same = givens.added + givens.removed + givens.changed + thermometers.added + thermometers.removed === 0
  return same ? null : { givens, thermometers }
}

const pathKey = (path: number[]) => path.map(cellName).join('-')

/** "2 givens added, 1 given changed and 1 thermometer removed": the changes as one phrase. */
export function describePuzzleChanges(changes: PuzzleChanges): string {
  const parts = [
    counted(changes.givens.added, 'given', 'added'),
    counted(changes.givens.removed, 'given', 'removed'),
    counted(changes.givens.changed, 'given', 'changed'),
    counted(changes.thermometers.added, 'thermometer', 'added'),
    counted(changes.thermometers.removed, 'thermometer', 'removed'),
  ].filter((p) => p !== '')
  if (parts.length <= 1) return parts.join('')
  return `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`
}

function counted(n: number, noun: string, what: string): string {
  if (n === 0) return ''
  return `${n} ${noun}${n === 1 ? '' : 's'} ${what}`
}
