/**
 * Two people's edits to one take, merged line by line against the copy both started from (the base):
 * a line or setting changed on one side only takes that side's change; changed on both sides (differently)
 * it is a conflict for a person to settle. Lines are matched by id; when both sides changed which lines
 * there are (a fold or a split on each side), the lines can't be matched and the whole script is one conflict.
 */
import type { Outline, OutlineLine } from '../schemas/outline'
import { setPace } from '../script/edits'

type Setting = 'pace' | 'names' | 'targetMs' | 'trim'
const SETTINGS: readonly Setting[] = ['pace', 'names', 'targetMs', 'trim']

export type MergeConflict =
  | { kind: 'line'; lineId: number; mine: OutlineLine | null; theirs: OutlineLine | null }
  | { kind: 'setting'; setting: Setting; mine: Outline[Setting]; theirs: Outline[Setting] }
  | { kind: 'chapters'; mine: Outline['chapters']; theirs: Outline['chapters'] }
  /** the lines (with their chapters) as a whole: both sides changed which lines there are */
  | { kind: 'lines'; mine: OutlineLine[]; theirs: OutlineLine[] }

export interface ScriptMerge {
  /** both sides' one-sided changes together; each conflict holds their copy until it is settled */
  merged: Outline
  conflicts: MergeConflict[]
  /** each side's chapters, which go with its lines when the lines are settled as a whole */
  chaptersOf: Record<Side, Outline['chapters']>
}

export type Side = 'mine' | 'theirs'

/** A conflict's key, stable across renders: which line, setting or list it is about. */
export function conflictKey(c: MergeConflict): string {
  return c.kind === 'line' ? `line-${c.lineId}` : c.kind === 'setting' ? `setting-${c.setting}` : c.kind
}

/**
 * Merges `mine` and `theirs` (the newer copy on the server) against `base`; with no base (edits kept in a
 * browser from a version no longer at hand) every difference is a conflict. The steps are theirs: a save
 * never changes them.
 */
export function mergeScripts(base: Outline | null, mine: Outline, theirs: Outline): ScriptMerge {
  const conflicts: MergeConflict[] = []
  let merged: Outline = { ...theirs }

  for (const setting of SETTINGS) {
    const pick = pickSide(base?.[setting], mine[setting], theirs[setting], base !== null)
    if (pick === 'conflict') conflicts.push({ kind: 'setting', setting, mine: mine[setting], theirs: theirs[setting] } as MergeConflict)
    else merged = withSetting(merged, setting, pick === 'mine' ? mine[setting] : theirs[setting])
  }

  const shapeMine = shapeOf(mine.lines)
  const shapeTheirs = shapeOf(theirs.lines)
  const shapeBase = base ? shapeOf(base.lines) : null
  if (shapeMine === shapeTheirs) {
    const baseById = new Map(base?.lines.map((l) => [l.id, l]))
    const theirsById = new Map(theirs.lines.map((l) => [l.id, l]))
    const lines = mine.lines.map((line) => {
      const other = theirsById.get(line.id)!
      const b = baseById.get(line.id)
      const pick = pickSide(b && written(b), written(line), written(other), base !== null)
      if (pick === 'conflict') conflicts.push({ kind: 'line', lineId: line.id, mine: line, theirs: other })
      return pick === 'mine' ? line : other
    })
    const chapters = pickSide(base?.chapters, mine.chapters, theirs.chapters, base !== null)
    if (chapters === 'conflict') conflicts.push({ kind: 'chapters', mine: mine.chapters, theirs: theirs.chapters })
    merged = { ...merged, lines, chapters: chapters === 'mine' ? mine.chapters : theirs.chapters }
  } else {
    // one side folded or split lines: its lines (and the chapters that start at them) stand, unless the other
    // side changed lines too, which can't be placed on lines that are no longer there
    const reshaped: Side | null = shapeBase === shapeTheirs ? 'mine' : shapeBase === shapeMine ? 'theirs' : null
    const other = reshaped === 'mine' ? theirs : mine
    if (reshaped === null || changedLines(base, other).length > 0) conflicts.push({ kind: 'lines', mine: mine.lines, theirs: theirs.lines })
    const side = reshaped === 'mine' ? mine : theirs
    merged = { ...merged, lines: side.lines, chapters: side.chapters }
  }

  // each side's lines are timed at its own pace: only lines from the other side of a changed pace need timing again
  return { merged: mine.pace === theirs.pace ? merged : reEstimated(merged), conflicts, chaptersOf: { mine: mine.chapters, theirs: theirs.chapters } }
}

/** The merge with each conflict settled as `choices` say (theirs where no choice is given). */
export function settleMerge(merge: ScriptMerge, choices: Record<string, Side>): Outline {
  let outline = merge.merged
  for (const c of merge.conflicts) {
    const side = choices[conflictKey(c)] ?? 'theirs'
    const value = c[side]
    if (c.kind === 'line') {
      outline = { ...outline, lines: outline.lines.map((l) => (l.id === c.lineId && value ? (value as OutlineLine) : l)) }
    } else if (c.kind === 'setting') {
      outline = withSetting(outline, c.setting, value as Outline[Setting])
    } else if (c.kind === 'chapters') {
      outline = { ...outline, chapters: value as Outline['chapters'] }
    } else {
      outline = { ...outline, lines: value as OutlineLine[], chapters: merge.chaptersOf[side] }
    }
  }
  return reEstimated(outline)
}

/** 'mine' or 'theirs' for the side that changed (theirs when neither or both did the same), or 'conflict'. */
function pickSide(base: unknown, mine: unknown, theirs: unknown, haveBase: boolean): Side | 'conflict' {
  if (same(mine, theirs)) return 'theirs'
  if (!haveBase) return 'conflict'
  if (same(base, mine)) return 'theirs'
  if (same(base, theirs)) return 'mine'
  return 'conflict'
}

/** Which lines there are and which steps each covers, as text. */
const shapeOf = (lines: OutlineLine[]) => lines.map((l) => `${l.id}:${l.steps.join(',')}`).join(' ')

function changedLines(base: Outline | null, side: Outline): OutlineLine[] {
  const baseById = new Map(base?.lines.map((l) => [l.id, l]))
  return side.lines.filter((l) => {
    const b = baseById.get(l.id)
    return !b || !same(written(b), written(l))
  })
}

/** What a person wrote of a line; its estimated time follows from the text and the pace, so it is left out. */
function written({ estMs: _derived, ...line }: OutlineLine): Omit<OutlineLine, 'estMs'> {
  return line
}

function withSetting(outline: Outline, setting: Setting, value: unknown): Outline {
  const next: Record<string, unknown> = { ...outline }
  if (value === undefined) delete next[setting]
  else next[setting] = value
  return next as Outline
}

// a line's estimated time follows the pace, which may have come from the other side
const reEstimated = (outline: Outline): Outline => setPace(outline, outline.pace)

function same(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b)
}
