/**
 * The puzzle file: Gridcue's own JSON for a sudoku with thermometers.
 * `puzzleFileShape` checks structure only, so the engine can turn content problems
 * into specific messages with cells; `puzzleFileSchema` adds the content rules for callers
 * that only need a yes or no (for example a request body).
 */
import { z } from 'zod'
import { text } from './text'

/** A cell name such as "r3c4": row then column, each 1..9. */
const cellNameSchema = z.string().regex(/^[rR][1-9][cC][1-9]$/, 'a cell name such as r3c4')

/** A puzzle's title, also carried by its outlines. */
export const puzzleTitleSchema = text({ label: 'title', max: 200, required: true, trim: true })
/** Who set the puzzle, also carried by its outlines. */
export const puzzleAuthorSchema = text({ label: 'author', max: 200, trim: true })

/** The structure of a puzzle file, without checking givens or cell names. */
export const puzzleFileShape = z.object({
  title: puzzleTitleSchema,
  author: puzzleAuthorSchema.optional(),
  // bounded, not yet checked: the engine names what is wrong with givens or a cell name, and where
  givens: text({ label: 'givens', max: 1000 }),
  thermometers: z
    .array(z.array(text({ label: 'cell name', max: 20 })).max(81, 'a thermometer can visit at most 81 cells'))
    .max(81, 'more than 81 thermometers')
    .default([]),
})

/** A puzzle file with its content rules: 81 givens of 1-9 or '.', thermometers as cell-name paths. */
export const puzzleFileSchema = puzzleFileShape.extend({
  givens: z.string().regex(/^[1-9.0]{81}$/, "81 characters, each 1-9 or '.'"),
  thermometers: z.array(z.array(cellNameSchema).min(2).max(9)).max(81).default([]),
})

export type PuzzleFile = z.infer<typeof puzzleFileSchema>
