/**
 * The grid's drawing geometry in SVG user units (a cell is 100 wide), built once per load: the studio's
 * GridBoard and the server's grid pictures draw from these same numbers. Which cells make a row, column or
 * box, and what cells are called, come from the grid geometry in shared/grid.
 */
import { cellName, cellSpokenName, colOf, HOUSES, houseIndex, rowOf } from '../grid'
import type { HouseRef } from '../grid'

export const CELL = 100
export const GRID_SIZE = 9 * CELL
/** room around the grid for half the frame's stroke */
export const GRID_PAD = 4
export const VIEW_BOX = `${-GRID_PAD} ${-GRID_PAD} ${GRID_SIZE + 2 * GRID_PAD} ${GRID_SIZE + 2 * GRID_PAD}`

export interface CellGeometry {
  x: number
  y: number
  cx: number
  cy: number
  /** "r3c4" */
  name: string
  /** "row 3, column 4", for screen readers */
  spokenName: string
}

export const CELLS: readonly CellGeometry[] = Array.from({ length: 81 }, (_, c) => {
  const x = colOf(c) * CELL
  const y = rowOf(c) * CELL
  return { x, y, cx: x + CELL / 2, cy: y + CELL / 2, name: cellName(c), spokenName: cellSpokenName(c) }
})

/** The nine rows (houses 0..8), as plain arrays of cells. */
export const ROWS: readonly number[][] = HOUSES.slice(0, 9).map((row) => Array.from(row))

function linesPath(step: (i: number) => boolean): string {
  let d = ''
  for (let i = 1; i < 9; i++) {
    if (!step(i)) continue
    d += `M${i * CELL} 0V${GRID_SIZE}M0 ${i * CELL}H${GRID_SIZE}`
  }
  return d
}
export const THIN_LINES = linesPath((i) => i % 3 !== 0)
export const BOX_LINES = linesPath((i) => i % 3 === 0)

/** Candidate d sits in a 3×3 pattern inside its cell: 1 2 3 on top, 7 8 9 at the bottom. */
export const CANDIDATE_OFFSET: readonly { dx: number; dy: number }[] = Array.from({ length: 10 }, (_, d) => ({
  dx: d ? (((d - 1) % 3) - 1) * 28 : 0,
  dy: d ? (Math.floor((d - 1) / 3) - 1) * 28 : 0,
}))

/**
 * Reason cells are hatched with 45° strokes 14 units apart. Drawn as a plain path per cell (precomputed here)
 * rather than a <pattern> fill: a pattern is an SVG resource, and adding or removing its users makes the
 * browser re-lay out and repaint far more of the grid than the cells that changed.
 */
const HATCH_STEP = 14 * Math.SQRT2 // lines x + y = c, 14 units apart measured across them
export const HATCH: readonly string[] = CELLS.map(({ x, y }) => {
  let d = ''
  for (let c = HATCH_STEP / 2; c < 2 * CELL; c += HATCH_STEP) {
    // the line x + y = c inside the cell, from its lower-left end to its upper-right end
    const x1 = Math.max(0, c - CELL)
    const x2 = Math.min(c, CELL)
    d += `M${(x + x1).toFixed(1)} ${(y + c - x1).toFixed(1)}L${(x + x2).toFixed(1)} ${(y + c - x2).toFixed(1)}`
  }
  return d
})

/** The outline drawn around a reason house: from its first (top-left) cell, as wide and tall as the house. */
export function houseRect(h: HouseRef): { x: number; y: number; w: number; h: number } {
  const { x, y } = CELLS[HOUSES[houseIndex(h)][0]]
  if (h.kind === 'row') return { x, y, w: GRID_SIZE, h: CELL }
  if (h.kind === 'column') return { x, y, w: CELL, h: GRID_SIZE }
  return { x, y, w: 3 * CELL, h: 3 * CELL }
}

/** A thermometer's tube through its cells' centres, bulb first. */
export function tubePath(cells: readonly number[]): string {
  return cells.map((c, i) => `${i ? 'L' : 'M'}${CELLS[c].cx} ${CELLS[c].cy}`).join('')
}

/** Sizes of the marks drawn on and around cells, in the same units. */
export const MARK = {
  /** tube stroke width, and the radius of its bulb; halos (reason, selected) a little wider */
  tube: 30,
  bulb: 31,
  tubeHalo: 42,
  bulbHalo: 38,
  /** inset of the focus ring, the error ring and the reason house's dashed outline from their cell or house */
  focusInset: 6,
  errorInset: 5,
  houseInset: 5,
  digitSize: 62,
  candidateSize: 24,
  /** the underline of a digit the step placed: half its width and its distance below the cell's centre */
  placedHalf: 16,
  placedBelow: 34,
  /** half the run and rise of the stroke through a removed candidate */
  strikeX: 11,
  strikeY: 9,
  /** a chain's numbered stop: distance from the cell's top-left corner, and radius */
  chainStop: 17,
  chainRadius: 13,
  chainNumberSize: 17,
} as const
