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
  'contradiction', // assume a candidate, follow simple steps, reach an empty cell or house
])
export type TechniqueId = z.infer<typeof techniqueIdSchema>

const placementSchema = z.object({ cell: cellSchema, digit: digitSchema })

const eliminationSchema = z.object({ cell: cellSchema, digits: listOf(digitSchema) })
export type Elimination = z.infer<typeof eliminationSchema>

const thermometerIndex = z.int().min(0)

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
})
export type ChainLink = z.infer<typeof chainLinkSchema>

/** The range a thermometer cell is limited to. */
const rangeSchema = z.object({ cell: cellSchema, min: digitSchema, max: digitSchema })

/** Structured facts the narration is built from, one shape per family of techniques. */
const stepFactsSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('single-cell'),
    cell: cellSchema,
    digit: digitSchema,
    /**
     * The other digits, grouped by why the cell can't hold them: placed in its row, column or box,
     * or removed from its candidates by earlier steps (which step is not recorded).
     */
    seen: z.preprocess(
      renamedRuledOut,
      z.object({ row: listOf(digitSchema), column: listOf(digitSchema), box: listOf(digitSchema), ruledOut: listOf(digitSchema) }),
    ),
  }),
  z.object({ kind: z.literal('single-house'), cell: cellSchema, digit: digitSchema, house: houseRefSchema, blockedCells: listOf(cellSchema) }),
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
    kind: z.literal('contradiction'),
    cell: cellSchema,
    assumed: digitSchema,
    chain: listOf(chainLinkSchema),
    /** where it breaks: a cell with no candidates, or a digit with no place in a house */
    emptyCell: cellSchema.optional(),
    emptyHouse: z.object({ house: houseRefSchema, digit: digitSchema }).optional(),
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
