import { computed, ref, toValue } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import type { PuzzleFile } from '@shared/schemas/puzzle'
import { puzzleDraftSchema } from '@shared/schemas/studio'
import type { PuzzleDraft, PuzzleRecord } from '@shared/schemas/studio'
import { usePuzzleCheck } from './usePuzzleCheck'
import { usePuzzleEntry } from './usePuzzleEntry'

/** The words around the grid, as the details form edits them. */
export interface PuzzleDetails {
  title: string
  author: string
  link: string
  publishedOn: string
  notes: string
}

export type PuzzleDetailErrors = Partial<Record<keyof PuzzleDetails, string>>

export interface PuzzleFormOptions {
  /** When false the form only shows the puzzle and never counts as unsaved. */
  editable: MaybeRefOrGetter<boolean>
}

/** What a blank new puzzle starts from. */
export const BLANK_PUZZLE: PuzzleDraft = { title: '', givens: '.'.repeat(81), thermometers: [] }

/**
 * The puzzle being edited on the Puzzle screen: its details, its grid with the live check, the version it was
 * read at, and whether it differs from what the server holds.
 */
export function usePuzzleForm({ editable }: PuzzleFormOptions) {
  const entry = usePuzzleEntry({ editable })
  const check = usePuzzleCheck({ givens: entry.givens, thermometers: entry.thermometers })
  const details = ref<PuzzleDetails>(emptyDetails())
  const fieldErrors = ref<PuzzleDetailErrors>({})
  /** The version the form was read at (sent back with a save); undefined for a puzzle never saved. */
  const baseVersion = ref<number | undefined>()
  /** The puzzle the form holds: its id, 'new', or null before anything is loaded. */
  const loadedId = ref<number | 'new' | null>(null)
  const savedSnapshot = ref('')

  /** The form as a draft for the server, trimmed but not yet checked. */
  function draft(): PuzzleDraft {
    const { title, author, link, publishedOn, notes } = details.value
    return {
      title: title.trim(),
      author: author.trim(),
      givens: entry.givensString.value,
      thermometers: entry.thermometerNames.value,
      link: link.trim(),
      publishedOn,
      notes,
    }
  }
  const snapshot = computed(() => JSON.stringify(draft()))
  const dirty = computed(() => toValue(editable) && snapshot.value !== savedSnapshot.value)

  /** Shows a puzzle as the server holds it (or a blank new one): nothing unsaved, no field errors. */
  function load(source: PuzzleRecord | PuzzleDraft, version: number | undefined, id: number | 'new'): void {
    details.value = {
      title: source.title,
      author: source.author ?? '',
      link: source.link ?? '',
      publishedOn: source.publishedOn ?? '',
      notes: source.notes ?? '',
    }
    entry.load({ givens: source.givens, thermometers: source.thermometers })
    baseVersion.value = version
    loadedId.value = id
    fieldErrors.value = {}
    check.flush()
    savedSnapshot.value = snapshot.value
  }

  /** Puts edits that were set aside back in the form, still unsaved against the version on the server. */
  function restore(mine: PuzzleDraft): void {
    const onServer = savedSnapshot.value
    load(mine, baseVersion.value, loadedId.value ?? 'new')
    savedSnapshot.value = onServer
  }

  /** Records a save: `sentSnapshot` is the form as it was sent, so edits typed while the request was out stay unsaved. */
  function markSaved(record: PuzzleRecord, sentSnapshot: string): void {
    baseVersion.value = record.version
    loadedId.value = record.id
    savedSnapshot.value = sentSnapshot
  }

  /** The draft as the server's contract reads it, or a problem to show (the details' own go beside their fields). */
  function validate(): { draft: PuzzleDraft } | { problem: string } {
    const parsed = puzzleDraftSchema.safeParse(draft())
    if (parsed.success) {
      fieldErrors.value = {}
      return { draft: parsed.data }
    }
    const errors: PuzzleDetailErrors = {}
    for (const issue of parsed.error.issues) {
      const key = issue.path[0]
      if (isDetail(key) && !errors[key]) errors[key] = capitalise(issue.message)
    }
    fieldErrors.value = errors
    return { problem: Object.keys(errors).length ? 'Some details need fixing before saving.' : parsed.error.issues[0].message }
  }

  /** The puzzle as a file: its grid and its credits. */
  function toFile(): PuzzleFile {
    const title = details.value.title.trim()
    const author = details.value.author.trim()
    return {
      title: title || 'Untitled puzzle',
      ...(author ? { author } : {}),
      givens: entry.givensString.value,
      thermometers: entry.thermometerNames.value,
    }
  }

  /** Takes the title, setter and grid from a file; the other details stay as typed, and nothing is saved yet. */
  function loadFile(file: PuzzleFile): void {
    details.value = { ...details.value, title: file.title, ...(file.author === undefined ? {} : { author: file.author }) }
    entry.load({ givens: file.givens, thermometers: file.thermometers })
  }

  return { entry, check, details, fieldErrors, baseVersion, loadedId, snapshot, dirty, draft, load, restore, markSaved, validate, toFile, loadFile }
}

export type PuzzleForm = ReturnType<typeof usePuzzleForm>

function emptyDetails(): PuzzleDetails {
  return { title: '', author: '', link: '', publishedOn: '', notes: '' }
}

function isDetail(key: PropertyKey | undefined): key is keyof PuzzleDetails {
  return typeof key === 'string' && key in emptyDetails()
}

function capitalise(s: string): string {
  return s ? s[0].toUpperCase() + s.slice(1) : s
}
