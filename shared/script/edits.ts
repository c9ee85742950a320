/**
 * Edit operations on an outline. Each returns a new outline and leaves its input untouched,
 * so the studio can keep old versions for undo. None of them touches the engine steps.
 */
import { DAY_MS, LINE_TEXT_MAX, outlineEditSchema, type NamingStyle, type Outline, type OutlineEdit, type OutlineLine } from '../schemas/outline'
import { checkTarget } from './build'
import { choosePhrasing, familyOf, renderLine } from './narrate'
import { stepBox } from './segments'
import { checkPace, estimateMs, lineActions } from './timing'
import { boxWords, capitalise } from './words'

const MAX_TITLE = 100

/** Replaces a line's words; the line is then marked edited and keeps them through re-renders. */
export function editLineText(outline: Outline, lineId: number, text: string): Outline {
  const line = lineOf(outline, lineId)
  const clean = typeof text === 'string' ? text.replace(/\s+/g, ' ').trim() : ''
  if (clean.length === 0) throw new Error(`line ${lineId} can't be empty; hide it instead`)
  checkLength(lineId, clean)
  return replaceLines(outline, [withText(outline, { ...line, text: clean, edited: true })])
}

/** Throws away a person's edit and renders the line afresh. */
export function revertLineText(outline: Outline, lineId: number): Outline {
  const line = lineOf(outline, lineId)
  return replaceLines(outline, [withText(outline, { ...line, text: renderLine(outline, line, line.phrasing), edited: false })])
}

/** Merges adjacent step lines into one; the merged line keeps the first line's id. */
export function foldLines(outline: Outline, lineIds: number[]): Outline {
  if (!Array.isArray(lineIds) || lineIds.length < 2) throw new Error('fold needs at least two lines')
  const indices = lineIds.map((id) => indexOf(outline, id)).sort((a, b) => a - b)
  indices.forEach((idx, k) => {
    const line = outline.lines[idx]
    if (line.kind !== 'step') throw new Error(`line ${line.id} is the ${line.kind} and can't be folded`)
    if (k > 0 && idx === indices[k - 1]) throw new Error(`line ${line.id} is listed twice`)
    if (k > 0 && idx !== indices[k - 1] + 1) throw new Error(`lines ${outline.lines[indices[k - 1]].id} and ${line.id} are not next to each other`)
    const chapter = outline.chapters.find((c) => c.lineId === line.id)
    if (k > 0 && chapter) throw new Error(`line ${line.id} starts the chapter "${chapter.title}"; remove the chapter before folding across it`)
  })
  const group = indices.map((i) => outline.lines[i])
  const first = group[0]
  const shape = { kind: 'step' as const, steps: group.flatMap((l) => l.steps) }
  const edited = group.some((l) => l.edited)
  const before = outline.lines[indices[0] - 1]
  const after = outline.lines[indices[indices.length - 1] + 1]
  const phrasing = edited ? 0 : choosePhrasing(outline, shape, [before, after].filter(isLine), lastOfFamily(outline, indices[0], shape))
  const merged: OutlineLine = withText(outline, {
    ...first,
    ...shape,
    phrasing,
    edited,
    // A person's words are kept; otherwise the run is said afresh as one line.
    text: edited ? group.map((l) => l.text).join(' ') : renderLine(outline, shape, phrasing),
    hidden: group.every((l) => l.hidden),
  })
  checkLength(first.id, merged.text)
  const lines = [...outline.lines.slice(0, indices[0]), merged, ...outline.lines.slice(indices[indices.length - 1] + 1)]
  return { ...outline, lines }
}

// The same limit the outline schema keeps, said here so an edit is refused before it is saved.
function checkLength(lineId: number, text: string): void {
  if (text.length > LINE_TEXT_MAX) throw new Error(`line ${lineId} would be too long (${text.length} characters, at most ${LINE_TEXT_MAX})`)
}

/** Splits a folded line back into one line per step; the first keeps the id (and any chapter). */
export function splitLine(outline: Outline, lineId: number): Outline {
  const idx = indexOf(outline, lineId)
  const line = outline.lines[idx]
  if (line.steps.length < 2) throw new Error(`line ${lineId} covers a single step and can't be split`)
  let nextId = Math.max(...outline.lines.map((l) => l.id)) + 1
  const made: OutlineLine[] = []
  const after = outline.lines[idx + 1]
  line.steps.forEach((step, k) => {
    const shape = { kind: 'step' as const, steps: [step] }
    const prev = k === 0 ? outline.lines[idx - 1] : made[k - 1]
    const neighbours = [prev, k === line.steps.length - 1 ? after : undefined].filter(isLine)
    const phrasing = choosePhrasing(outline, shape, neighbours, lastOfFamily(outline, idx, shape, made))
    made.push(
      withText(outline, {
        id: k === 0 ? line.id : nextId++,
        ...shape,
        text: renderLine(outline, shape, phrasing),
        edited: false,
        hidden: line.hidden,
        phrasing,
        estMs: 0,
        ...(k === 0 && line.alignedStartMs !== undefined ? { alignedStartMs: line.alignedStartMs } : {}),
      }),
    )
  })
  return { ...outline, lines: [...outline.lines.slice(0, idx), ...made, ...outline.lines.slice(idx + 1)] }
}

/** Leaves a line out of the video: it takes no time and no export shows it. */
export function hideLine(outline: Outline, lineId: number): Outline {
  const line = lineOf(outline, lineId)
  if (line.hidden) throw new Error(`line ${lineId} is already hidden`)
  if (outline.lines.every((l) => l.hidden || l.id === lineId)) throw new Error(`line ${lineId} is the last one showing and can't be hidden`)
  return replaceLines(outline, [{ ...line, hidden: true }])
}

export function showLine(outline: Outline, lineId: number): Outline {
  const line = lineOf(outline, lineId)
  if (!line.hidden) throw new Error(`line ${lineId} is not hidden`)
  return replaceLines(outline, [{ ...line, hidden: false }])
}

/** Starts a chapter at a line; without a title it is named after where the line happens. */
export function startChapterAt(outline: Outline, lineId: number, title?: string): Outline {
  const idx = indexOf(outline, lineId)
  if (outline.chapters.some((c) => c.lineId === lineId)) throw new Error(`line ${lineId} already starts a chapter`)
  const line = outline.lines[idx]
  const name =
    title === undefined
      ? line.kind === 'step'
        ? capitalise(boxWords(stepBox(outline.steps[line.steps[0]]), { style: 'words', thermometers: [] }))
        : capitalise(line.kind)
      : checkTitle(title)
  const order = new Map(outline.lines.map((l, i) => [l.id, i]))
  const chapters = [...outline.chapters, { lineId, title: name, edited: title !== undefined }].sort(
    (a, b) => (order.get(a.lineId) ?? 0) - (order.get(b.lineId) ?? 0),
  )
  return { ...outline, chapters }
}

export function renameChapter(outline: Outline, lineId: number, title: string): Outline {
  chapterAt(outline, lineId)
  const clean = checkTitle(title)
  return { ...outline, chapters: outline.chapters.map((c) => (c.lineId === lineId ? { ...c, title: clean, edited: true } : c)) }
}

export function removeChapter(outline: Outline, lineId: number): Outline {
  const chapter = chapterAt(outline, lineId)
  if (outline.chapters[0] === chapter) throw new Error(`the first chapter starts the video at 0:00 and can't be removed; rename it instead`)
  return { ...outline, chapters: outline.chapters.filter((c) => c !== chapter) }
}

/** A new pace re-estimates every line. */
export function setPace(outline: Outline, pace: number): Outline {
  const p = checkPace(pace)
  const next = { ...outline, pace: p }
  return { ...next, lines: next.lines.map((l) => withText(next, l)) }
}

/** Re-renders unedited lines in the other naming style; edited lines keep their words. */
export function setNames(outline: Outline, names: NamingStyle): Outline {
  if (names !== 'words' && names !== 'coords') throw new Error(`names must be "words" or "coords" (got ${String(names)})`)
  const next = { ...outline, names }
  return { ...next, lines: next.lines.map((l) => (l.edited ? l : withText(next, { ...l, text: renderLine(next, l, l.phrasing) }))) }
}

/**
 * The outline with every line nobody edited said in the current narration (a fix to the wording reaches
 * takes made before it); the same object when nothing would change, so opening a take saves nothing then.
 */
export function refreshNarration(outline: Outline): Outline {
  const refreshed = setNames(outline, outline.names)
  return refreshed.lines.some((line, i) => line.text !== outline.lines[i].text) ? refreshed : outline
}

/** Sets (or clears, with null) the length the video should come out at. */
export function setTarget(outline: Outline, targetMs: number | null): Outline {
  if (targetMs === null) {
    const { targetMs: _dropped, ...rest } = outline
    return rest
  }
  return { ...outline, targetMs: checkTarget(outline, targetMs) }
}

/** Pins a line's start to the recording (or unpins it, with null); aligned starts must run forward. */
export function alignLine(outline: Outline, lineId: number, startMs: number | null): Outline {
  const idx = indexOf(outline, lineId)
  const line = outline.lines[idx]
  if (startMs === null) {
    const { alignedStartMs: _dropped, ...rest } = line
    return replaceLines(outline, [rest])
  }
  if (typeof startMs !== 'number' || !Number.isFinite(startMs) || startMs < 0 || startMs >= DAY_MS) {
    throw new Error(`line ${lineId}: a start time must be a number of milliseconds from 0 to under 24 hours (got ${String(startMs)})`)
  }
  const ms = Math.round(startMs)
  const before = outline.lines.slice(0, idx).reverse().find((l) => l.alignedStartMs !== undefined)
  const after = outline.lines.slice(idx + 1).find((l) => l.alignedStartMs !== undefined)
  if (before?.alignedStartMs !== undefined && ms < before.alignedStartMs) {
    throw new Error(`line ${lineId} can't start before line ${before.id}, which starts at ${before.alignedStartMs} ms`)
  }
  if (after?.alignedStartMs !== undefined && ms > after.alignedStartMs) {
    throw new Error(`line ${lineId} can't start after line ${after.id}, which starts at ${after.alignedStartMs} ms`)
  }
  return replaceLines(outline, [{ ...line, alignedStartMs: ms }])
}

/** Sets where the recording is cut to make the video (null and null: no trim, the whole recording). */
function setTrim(outline: Outline, inMs: number | null, outMs: number | null): Outline {
  if (inMs === null && outMs === null) {
    const { trim: _dropped, ...rest } = outline
    return rest
  }
  const point = (name: string, ms: number) => {
    if (!Number.isFinite(ms) || ms < 0 || ms >= DAY_MS) throw new Error(`the ${name} point must be a number of milliseconds from 0 to under 24 hours (got ${String(ms)})`)
    return Math.round(ms)
  }
  const cutIn = point('in', inMs ?? 0)
  if (outMs === null) return { ...outline, trim: { inMs: cutIn } }
  const cutOut = point('out', outMs)
  if (cutOut <= cutIn) throw new Error(`the video must end after it starts: out (${cutOut} ms) must be after in (${cutIn} ms)`)
  return { ...outline, trim: { inMs: cutIn, outMs: cutOut } }
}

/** Runs an edit received as data (e.g. from the API); the edit is validated first. */
export function applyEdit(outline: Outline, edit: unknown): Outline {
  const parsed = outlineEditSchema.safeParse(edit)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]
    throw new Error(`invalid edit: ${issue.path.join('.') || 'edit'}: ${issue.message}`)
  }
  const e: OutlineEdit = parsed.data
  // TypeScript can't tie APPLY[e.op] to the narrowed edit; APPLY's own type keeps each entry honest.
  return (APPLY[e.op] as (o: Outline, e: OutlineEdit) => Outline)(outline, e)
}

/** One entry per edit the schema allows, so a new edit fails to compile until it runs here. */
const APPLY: { readonly [Op in OutlineEdit['op']]: (o: Outline, e: Extract<OutlineEdit, { op: Op }>) => Outline } = {
  editLineText: (o, e) => editLineText(o, e.lineId, e.text),
  revertLineText: (o, e) => revertLineText(o, e.lineId),
  foldLines: (o, e) => foldLines(o, e.lineIds),
  splitLine: (o, e) => splitLine(o, e.lineId),
  hideLine: (o, e) => hideLine(o, e.lineId),
  showLine: (o, e) => showLine(o, e.lineId),
  startChapterAt: (o, e) => startChapterAt(o, e.lineId, e.title),
  renameChapter: (o, e) => renameChapter(o, e.lineId, e.title),
  removeChapter: (o, e) => removeChapter(o, e.lineId),
  setPace: (o, e) => setPace(o, e.pace),
  setNames: (o, e) => setNames(o, e.names),
  setTarget: (o, e) => setTarget(o, e.targetMs),
  alignLine: (o, e) => alignLine(o, e.lineId, e.startMs),
  setTrim: (o, e) => setTrim(o, e.inMs, e.outMs),
}

function indexOf(outline: Outline, lineId: number): number {
  const idx = outline.lines.findIndex((l) => l.id === lineId)
  if (idx < 0) throw new Error(`line ${lineId} does not exist`)
  return idx
}

function lineOf(outline: Outline, lineId: number): OutlineLine {
  return outline.lines[indexOf(outline, lineId)]
}

function chapterAt(outline: Outline, lineId: number) {
  const chapter = outline.chapters.find((c) => c.lineId === lineId)
  if (!chapter) throw new Error(`no chapter starts at line ${lineId}`)
  return chapter
}

function checkTitle(title: unknown): string {
  const clean = typeof title === 'string' ? title.replace(/\s+/g, ' ').trim() : ''
  if (clean.length === 0) throw new Error('a chapter title can\'t be empty')
  if (clean.length > MAX_TITLE) throw new Error(`a chapter title has at most ${MAX_TITLE} characters (got ${clean.length})`)
  return clean
}

/** The line with its estimate brought up to date with its text and the outline's pace. */
function withText(outline: Outline, line: OutlineLine): OutlineLine {
  return { ...line, estMs: estimateMs(line.text, outline.pace, lineActions(outline, line)) }
}

function replaceLines(outline: Outline, changed: OutlineLine[]): Outline {
  const byId = new Map(changed.map((l) => [l.id, l]))
  return { ...outline, lines: outline.lines.map((l) => byId.get(l.id) ?? l) }
}

/** The phrasing of the nearest earlier line of the same family, so a new line doesn't repeat it. */
function lastOfFamily(outline: Outline, beforeIndex: number, shape: Pick<OutlineLine, 'kind' | 'steps'>, made: OutlineLine[] = []): number | undefined {
  const family = familyOf(outline, shape)
  const earlier = [...outline.lines.slice(0, beforeIndex), ...made]
  return earlier.reverse().find((l) => !l.edited && familyOf(outline, l) === family)?.phrasing
}

function isLine(l: OutlineLine | undefined): l is OutlineLine {
  return l !== undefined
}
