/**
 * The engine's public contract: what a solve path looks like.
 * The script writer (shared/script), the server and the client read these records;
 * fields may be added, but existing ones keep their meaning.
 */

/** 0..80, row-major: row = floor(cell / 9), column = cell % 9. */
export type Cell = number
/** 1..9 */
export type Digit = number

export type HouseKind = 'row' | 'column' | 'box'
/** index 0..8; boxes are numbered row-major from the top-left box. */
export interface HouseRef {
  kind: HouseKind
  index: number
}

/** A puzzle after parsing: givens as digits (0 = empty), thermometers as cell paths, bulb first. */
export interface Puzzle {
  title: string
  author?: string
  givens: Uint8Array | number[]
  thermometers: Cell[][]
}

export type TechniqueId =
  | 'naked-single' // last candidate in a cell
  | 'hidden-single' // only place for a digit in a house
  | 'naked-pair'
  | 'naked-triple'
  | 'hidden-pair'
  | 'hidden-triple'
  | 'locked-box-line' // a box's candidates for a digit all on one line: clear the rest of the line
  | 'locked-line-box' // a line's candidates for a digit all in one box: clear the rest of the box
  | 'thermo-length' // position i of an n-cell thermometer holds i … 9 − n + i
  | 'thermo-bounds' // bounds carried along a thermometer from fixed or restricted cells
  | 'contradiction' // assume a candidate, follow simple steps, reach an empty cell or house

export interface Placement {
  cell: Cell
  digit: Digit
}

export interface Elimination {
  cell: Cell
  digits: Digit[]
}

/** One consequence inside a contradiction chain. */
export interface ChainLink {
  technique: TechniqueId
  /** 'place' puts digit in cell; 'eliminate' removes digits from cell */
  kind: 'place' | 'eliminate'
  cell: Cell
  digits: Digit[]
  /** house or thermometer that forced it, when there is one */
  house?: HouseRef
  thermometer?: number
}

/** Structured facts the narration is built from, one shape per family of techniques. */
export type StepFacts =
  | {
      kind: 'single-cell'
      cell: Cell
      digit: Digit
      /** digits the cell sees, grouped by where they are seen */
      seen: { row: Digit[]; column: Digit[]; box: Digit[]; thermometer: Digit[] }
    }
  | { kind: 'single-house'; cell: Cell; digit: Digit; house: HouseRef; blockedCells: Cell[] }
  | { kind: 'subset'; form: 'naked' | 'hidden'; house: HouseRef; cells: Cell[]; digits: Digit[] }
  | { kind: 'locked'; digit: Digit; box: number; line: HouseRef; direction: 'box-to-line' | 'line-to-box'; cells: Cell[] }
  | {
      kind: 'thermo-length'
      thermometer: number
      length: number
      /** the range each cell is limited to, in path order */
      ranges: { cell: Cell; min: Digit; max: Digit }[]
    }
  | {
      kind: 'thermo-bounds'
      thermometer: number
      /** 'min': a cell must exceed the smallest digit possible before it; 'max': stay below the largest after it */
      direction: 'min' | 'max'
      /** the cell whose value bounds the others, and the bound it gives */
      fromCell: Cell
      fromDigit: Digit
      /** cells whose range changed, with the new range */
      ranges: { cell: Cell; min: Digit; max: Digit }[]
      /** true when sudoku eliminations (a digit already in a house) fed the bound */
      withSudoku: boolean
    }
  | {
      kind: 'contradiction'
      cell: Cell
      assumed: Digit
      chain: ChainLink[]
      /** where it breaks: a cell with no candidates, or a digit with no place in a house */
      emptyCell?: Cell
      emptyHouse?: { house: HouseRef; digit: Digit }
    }

export interface Step {
  technique: TechniqueId
  placements: Placement[]
  /** eliminations of placed digits from their peers are implied by placements and not listed */
  eliminations: Elimination[]
  /** the cells the step is about (highlighted on screen) */
  focus: Cell[]
  /** why: the houses, thermometers and cells that force the step */
  reason: { houses: HouseRef[]; thermometers: number[]; cells: Cell[] }
  facts: StepFacts
  /** relative effort to explain; higher is harder */
  difficulty: number
  /** cells a presenter would have pencil-marked once this step is done (cumulative) */
  marks: Cell[]
  /** one-line plain description */
  text: string
}

export interface ValidationError {
  code:
    | 'malformed'
    | 'givens-length'
    | 'givens-character'
    | 'duplicate-given'
    | 'thermometer-too-short'
    | 'thermometer-too-long'
    | 'thermometer-repeated-cell'
    | 'thermometer-not-adjacent'
    | 'thermometer-bad-cell'
    | 'thermometer-order'
    | 'no-solution'
    | 'multiple-solutions'
  message: string
  cells: Cell[]
}

export interface SolveResult {
  status: 'solved' | 'stuck' | 'invalid'
  steps: Step[]
  /** 81 chars, '.' where still empty */
  grid: string
  difficulty: number
  errors?: ValidationError[]
}

export interface GridState {
  /** 0 = empty */
  digits: Uint8Array
  /** bit (d - 1) set when d is still a candidate */
  candidates: Uint16Array
  /** cells showing pencil marks at this point */
  marks: Cell[]
  /** true for cells that were given */
  givens: Uint8Array
}
