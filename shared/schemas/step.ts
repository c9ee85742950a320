/**
 * The step contract: what one step of a solve path looks like, written once as zod schemas.
 * The engine builds these records and takes its types from here (`import type` only, so the
 * engine carries no zod); outlines store them and the server checks them on the way in.
 * Fields may be added, but existing ones keep their meaning.
 */
import { z } from 'zod'
import { text } from './text'

// Every list in a step names cells, digits, houses or candidates of one grid, so none is longer than the
// grid has candidates (81 cells × 9 digits); the bound keeps a request from sending an endless one.
const CANDIDATES = 81 * 9
const listOf = <T extends z.ZodType>(item: T) => z.array(item).max(CANDIDATES)

/** 0..80, row-major: row = floor(cell / 9), column = cell % 9. */
export const cellSchema = z.int().min(0).max(80)
export type Cell = z.infer<typeof cellSchema>

const digitSchema = z.int().min(1).max(9)
export type Digit = z.infer<typeof digitSchema>

const houseKindSchema = z.enum(['row', 'column', 'box'])
export type HouseKind = z.infer<typeof houseKindSchema>

/** index 0..8; boxes are numbered row-major from the top-left box. */
const houseRefSchema = z.object({ kind: houseKindSchema, index: z.int().min(0).max(8) })
export type HouseRef = z.infer<typeof houseRefSchema>

/** Every technique the engine knows; the catalog, the solve order and the narration are keyed by these. */
const techniqueIdSchema = z.enum([
  'naked-single', // last candidate in a cell
  'hidden-single', // only place for a digit in a house
  'naked-pair',
  'naked-triple',
  'hidden-pair',
  'hidden-triple',
  'locked-box-line', // a box's candidates for a digit all on one line: clear the rest of the line
  'locked-line-box', // a line's candidates for a digit all in one box: clear the rest of the box
  'thermo-length', // position i of an n-cell thermometer holds i … 9 − n + i
  'thermo-bounds', // bounds carried along a thermometer from fixed or restricted cells
  'thermo-pointing', // a house's places for a digit all lie before (after) a thermometer cell: it is higher (lower)
  'thermo-either', // a digit's two places in a house each rule a cell out, one through a thermometer
  'thermo-ends', // a digit's two places in a house each force their thermometer's tip to 9 (bulb to 1)
  'x-wing', // two lines whose places for a digit lie in the same two crossing lines: clear the rest of those
  'swordfish', // the same with three lines
  'xy-wing', // a two-digit pivot and two pincers: one pincer holds the shared digit
  'xyz-wing', // a three-digit pivot and two pincers: one of the three holds the shared digit
  'w-wing', // two matching two-digit cells joined by a digit's two places in a house
  'either-way', // a two-way choice followed both ways a few moves: what both sides reach holds
  'contradiction', // assume a candidate, follow simple steps, reach an empty cell or house
])
export type TechniqueId = z.infer<typeof techniqueIdSchema>

const placementSchema = z.object({ cell: cellSchema, digit: digitSchema })

const eliminationSchema = z.object({ cell: cellSchema, digits: listOf(digitSchema) })
export type Elimination = z.infer<typeof eliminationSchema>

const thermometerIndex = z.int().min(0)

/** A step's place in its path, from 0 (the index an outline line's `steps` use). */
const stepIndex = z.int().min(0).max(CANDIDATES)

/** One consequence inside a contradiction chain. */
const chainLinkSchema = z.object({
  technique: techniqueIdSchema,
  /** 'place' puts digit in cell; 'eliminate' removes digits from cell */
  kind: z.enum(['place', 'eliminate']),
  cell: cellSchema,
  digits: listOf(digitSchema),
  /** house or thermometer that forced it, when there is one */
  house: houseRefSchema.optional(),
  thermometer: thermometerIndex.optional(),
  /**
   * What pushed it: a digit placed by the assumption or an earlier link (`cell` holds `digit`), or
   * for a thermometer link the neighbour whose bound moved (`digit` is that neighbour's new smallest
   * digit when it sits before the cell, its new largest when it sits after). Older outlines lack it.
   */
  because: z.object({ cell: cellSchema, digit: digitSchema }).optional(),
})
export type ChainLink = z.infer<typeof chainLinkSchema>

/** One side of an either-way step: "if `cell` is `digit`", and the moves that follow from it. */
const eitherSideSchema = z.object({ cell: cellSchema, digit: digitSchema, chain: listOf(chainLinkSchema) })

/** The range a thermometer cell is limited to. */
const rangeSchema = z.object({ cell: cellSchema, min: digitSchema, max: digitSchema })

/** A cell and a thermometer it shares with another cell, `steps` places apart on it. */
const thermoStepsSchema = z.object({ cell: cellSchema, thermometer: thermometerIndex, steps: z.int().min(1).max(8) })

/** Structured facts the narration is built from, one shape per family of techniques. */
const stepFactsSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('single-cell'),
    cell: cellSchema,
    digit: digitSchema,
    /**
     * The other digits, grouped by why the cell can't hold them: placed in its row, column or box,
     * or removed from its candidates by earlier steps (`ruledOut`; which steps is in `ruledOutBy`).
     */
    seen: z.preprocess(
      renamedRuledOut,
      z.object({ row: listOf(digitSchema), column: listOf(digitSchema), box: listOf(digitSchema), ruledOut: listOf(digitSchema) }),
    ),
    /** for each digit of `seen.ruledOut`, the earlier step that removed it (absent in older outlines) */
    ruledOutBy: listOf(z.object({ digit: digitSchema, step: stepIndex })).optional(),
  }),
  z.object({
    kind: z.literal('single-house'),
    cell: cellSchema,
    digit: digitSchema,
    house: houseRefSchema,
    blockedCells: listOf(cellSchema),
    /**
     * Why each blocked cell can't take the digit: `peer` holds it (placed or given), or the earlier
     * `step` removed it from the cell. In `blockedCells` order; absent in older outlines.
     */
    blockers: listOf(z.union([z.object({ cell: cellSchema, peer: cellSchema }), z.object({ cell: cellSchema, step: stepIndex })])).optional(),
  }),
  z.object({
    kind: z.literal('subset'),
    form: z.enum(['naked', 'hidden']),
    house: houseRefSchema,
    cells: listOf(cellSchema),
    digits: listOf(digitSchema),
  }),
  z.object({
    kind: z.literal('locked'),
    digit: digitSchema,
    box: z.int().min(0).max(8),
    line: houseRefSchema,
    direction: z.enum(['box-to-line', 'line-to-box']),
    cells: listOf(cellSchema),
  }),
  z.object({
    kind: z.literal('thermo-length'),
    thermometer: thermometerIndex,
    length: z.int().min(2).max(9),
    /** the range each cell is limited to, in path order */
    ranges: listOf(rangeSchema),
  }),
  z.object({
    kind: z.literal('thermo-bounds'),
    thermometer: thermometerIndex,
    /** 'min': a cell must exceed the smallest digit possible before it; 'max': stay below the largest after it */
    direction: z.enum(['min', 'max']),
    /** the cell whose value bounds the others, and the bound it gives */
    fromCell: cellSchema,
    fromDigit: digitSchema,
    /** cells whose range changed, with the new range */
    ranges: listOf(rangeSchema),
    /** true when sudoku eliminations (a digit already in a house) fed the bound */
    withSudoku: z.boolean(),
  }),
  z.object({
    kind: z.literal('thermo-pointing'),
    digit: digitSchema,
    /** the house whose places for the digit all lie on thermometers through `cell` */
    house: houseRefSchema,
    /** 'before': every place lies before `cell`, so it is higher than the digit; 'after': every place lies after it, so lower */
    side: z.enum(['before', 'after']),
    /** each place, a thermometer it shares with `cell`, and how many places apart the two stand on it */
    homes: listOf(thermoStepsSchema),
    cell: cellSchema,
    /** `cell`'s new smallest ('before') or largest ('after') digit: the digit plus or minus the smallest distance */
    bound: digitSchema,
  }),
  z.object({
    kind: z.literal('thermo-either'),
    digit: digitSchema,
    /** the house where the digit has exactly two places */
    house: houseRefSchema,
    /** the cell that loses digits, whichever place holds the digit; it may be one of the places */
    cell: cellSchema,
    /** the two places, each with what it does to `cell`: a thermometer they share, a house, or being `cell` itself */
    homes: listOf(
      z.discriminatedUnion('via', [
        thermoStepsSchema.extend({ via: z.literal('thermometer'), side: z.enum(['before', 'after']) }),
        z.object({ via: z.literal('house'), cell: cellSchema, house: houseRefSchema }),
        // the place is `cell` itself: if it holds the digit, that's all it holds
        z.object({ via: z.literal('itself'), cell: cellSchema }),
      ]),
    ),
  }),
  z.object({
    kind: z.literal('thermo-ends'),
    digit: digitSchema,
    /** the house where the digit has exactly two places */
    house: houseRefSchema,
    /** 'tip': from either place its thermometer climbs one by one up to 9 at the tip; 'bulb': down to 1 at the bulb */
    end: z.enum(['tip', 'bulb']),
    /** the two places, each with its thermometer and that thermometer's tip or bulb */
    homes: listOf(z.object({ cell: cellSchema, thermometer: thermometerIndex, end: cellSchema })),
    /** cells that see both ends and so lose 9 (tips) or 1 (bulbs) */
    eliminated: listOf(cellSchema),
  }),
  z.object({
    kind: z.literal('fish'),
    digit: digitSchema,
    /** the rows (or columns) whose places for the digit all lie in the cover lines */
    baseLines: listOf(houseRefSchema),
    /** the crossing columns (or rows) those places lie in, as many as there are base lines */
    coverLines: listOf(houseRefSchema),
    /** the base lines' places for the digit */
    cells: listOf(cellSchema),
    /** cover-line cells outside the base lines that lose the digit */
    eliminated: listOf(cellSchema),
  }),
  z.object({
    kind: z.literal('wing'),
    /** 'xy': the pivot holds two digits, one shared with each pincer; 'xyz': it also holds `digit` */
    form: z.enum(['xy', 'xyz']),
    pivot: cellSchema,
    pivotDigits: listOf(digitSchema),
    /** two cells that see the pivot, each holding `digit` and one other digit of the pivot */
    pincers: listOf(cellSchema),
    /** for each pincer, its digit besides `digit` (the one it shares with the pivot) */
    pincerDigits: listOf(digitSchema),
    /** the digit one of the pincers (or, for 'xyz', the pivot) must hold */
    digit: digitSchema,
    /** cells that see both pincers (and, for 'xyz', the pivot) and lose `digit` */
    eliminated: listOf(cellSchema),
  }),
  z.object({
    kind: z.literal('w-wing'),
    /** two cells that don't see each other, both holding only `digits` */
    cells: listOf(cellSchema),
    digits: listOf(digitSchema),
    /** the digit one of the two cells must hold, removed from cells that see both */
    digit: digitSchema,
    /** the other digit's only two places in a house; cells[0] sees the link's cells[0], cells[1] its cells[1] */
    link: z.object({ house: houseRefSchema, digit: digitSchema, cells: listOf(cellSchema) }),
    eliminated: listOf(cellSchema),
  }),
  z.object({
    kind: z.literal('either-way'),
    /** set when the sides are a digit's only places in this house; absent when they are a cell's only candidates */
    house: houseRefSchema.optional(),
    /** the two or three assumptions, one of which holds, each with the moves (at most four) it leads through */
    sides: listOf(eitherSideSchema).min(2).max(3),
    /** what both sides reach */
    placed: listOf(placementSchema),
    eliminated: listOf(eliminationSchema),
  }),
  z.object({
    kind: z.literal('contradiction'),
    cell: cellSchema,
    assumed: digitSchema,
    chain: listOf(chainLinkSchema),
    /** where it breaks: a cell with no candidates, or a digit with no place in a house */
    emptyCell: cellSchema.optional(),
    emptyHouse: z.object({ house: houseRefSchema, digit: digitSchema }).optional(),
    /** true for a long what-if (more than six links), taken only when no shorter one exists */
    long: z.boolean().optional(),
  }),
])
export type StepFacts = z.infer<typeof stepFactsSchema>
export type FactsKind = StepFacts['kind']
/** The facts of one kind, e.g. `FactsOf<'subset'>`. */
export type FactsOf<K extends FactsKind> = Extract<StepFacts, { kind: K }>

const stepObject = z.object({
  technique: techniqueIdSchema,
  placements: listOf(placementSchema),
  /** eliminations of placed digits from their peers are implied by placements and not listed */
  eliminations: listOf(eliminationSchema),
  /** the cells the step is about (highlighted on screen) */
  focus: listOf(cellSchema),
  /** why: the houses, thermometers and cells that force the step */
  reason: z.object({ houses: listOf(houseRefSchema), thermometers: listOf(thermometerIndex), cells: listOf(cellSchema) }),
  facts: stepFactsSchema,
  /** relative effort to explain; higher is harder */
  difficulty: z.number(),
  /** cells a presenter would have pencil-marked once this step is done (cumulative) */
  marks: listOf(cellSchema),
  /** one-line plain description */
  text: text({ label: 'step text', max: 2000 }),
})
export type Step = z.infer<typeof stepObject>

/** An engine step as stored inside an outline; unknown extra fields are kept (the engine may add some). */
export const stepSchema: z.ZodType<Step> = stepObject.loose()

/**
 * `seen.ruledOut` was stored as `seen.thermometer` until it was renamed (it never meant thermometer
 * digits). The database is migrated; this reads the copies a migration can't reach, such as a
 * browser's unsaved draft or an outline JSON backup.
 */
function renamedRuledOut(seen: unknown): unknown {
  if (typeof seen !== 'object' || seen === null || 'ruledOut' in seen || !('thermometer' in seen)) return seen
  const { thermometer, ...rest } = seen
  return { ...rest, ruledOut: thermometer }
}
