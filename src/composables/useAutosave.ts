import { computed, onScopeDispose, ref, shallowRef, toRaw, toValue, watch } from 'vue'
import type { MaybeRefOrGetter, Ref } from 'vue'
import { useTimeoutFn } from '@vueuse/core'
import { z } from 'zod'
import { outlineSchema, scriptOf } from '@shared/schemas/outline'
import type { Outline } from '@shared/schemas/outline'
import type { OutlineRecord, OutlineSummary } from '@shared/schemas/studio'
import { mergeScripts, settleMerge, type ScriptMerge, type Side } from '@shared/takes/merge-scripts'
import { DATABASE_UNAVAILABLE, isApiError, retryDelayMs } from '@/api/http'
import { isStaleError } from '@/api/stale'
import { useUnsavedChangesGuard } from '@/composables/useUnsavedChangesGuard'

/** `retrying`: a save failed for a reason that passes by itself (no connection, database away, server error) and is tried again. */
export type SaveStatus = 'saved' | 'saving' | 'unsaved' | 'retrying' | 'conflict'

/** Why saving waits to try again: the part of the status line after "Not saved —". */
type RetryReason = 'database' | 'offline' | 'server'

export interface AutosaveOptions {
  outlineId: MaybeRefOrGetter<number>
  /** Whose edits these are: a local copy belongs to the person who made it, never to the next one to sign in on this browser. */
  userId: MaybeRefOrGetter<number>
  /** The outline as it is now in the editor; every new snapshot counts as a change. */
  outline: Readonly<Ref<Outline | null>>
  /** PATCH with the version read; resolves to the saved summary, rejects with a StaleError<OutlineRecord> when stale (src/api/outlines.ts). */
  save: (version: number, outline: Outline) => Promise<OutlineSummary>
  /** Puts a document in the editor (taking the server's copy, discarding a restored one). */
  replace: (outline: Outline) => void
  /** The record the server now holds: the summary it answered with the outline that was sent. */
  onSaved?: (record: OutlineRecord) => void
  /** Quiet time after the last edit before saving. */
  delayMs?: number
  /** Wait before the first new try after a failed save (network down, database away, server error; 2 s); it doubles with each failure. */
  retryMs?: number
  /** The longest wait between tries (a minute). */
  maxRetryMs?: number
}

export interface SaveConflict {
  mine: Outline
  theirs: OutlineRecord
  /** both copies merged line by line; its conflicts are the lines and settings both people changed */
  merge: ScriptMerge
}

/** What a browser keeps of unsaved edits, so a reload or a crash never loses them. */
const localCopySchema = z.object({
  baseVersion: z.int().min(1),
  savedAt: z.string(),
  outline: outlineSchema,
})
export type LocalCopy = z.infer<typeof localCopySchema>

export function localCopyKey(outlineId: number, userId: number): string {
  return `gridcue.studio.user.${userId}.outline.${outlineId}`
}

/** Where a copy was kept before copies were kept per person. */
export function unownedCopyKey(outlineId: number): string {
  return `gridcue.studio.outline.${outlineId}`
}

/**
 * Saves the outline about a second after the last edit, with the version it was read at. Until the
 * server has it, the pending outline waits in localStorage. A save that fails for a passing reason
 * (no connection, the database away, a server error) is tried again, waiting longer each time. A save
 * refused as stale (someone saved first) becomes a conflict holding both copies; the person keeps
 * theirs (saved over the newer version) or takes the server's.
 */
export function useAutosave(options: AutosaveOptions) {
  const delayMs = options.delayMs ?? 1000
  const { retryMs, maxRetryMs } = options

  const status = ref<SaveStatus>('saved')
  /** The server version the next save is based on. */
  const version = ref<number | null>(null)
  const conflict = shallowRef<SaveConflict | null>(null)
  /** When a local copy from an earlier visit was put back; null when none was. */
  const restoredFrom = ref<string | null>(null)
  const lastError = ref<string | null>(null)
  const retryReason = ref<RetryReason>('server')
  /** Failed tries in a row, for the back-off; a save that lands starts it over. */
  let failures = 0
  /** The last outline the server is known to hold; reference equality means "nothing to save". */
  const baseline = shallowRef<Outline | null>(null)
  /** The server's copy when the screen opened, for "discard restored edits". */
  let opened: Outline | null = null
  // One pending save at a time: each edit pushes it back (a quiet second after the last), a failure sets it for later.
  let nextSaveIn = delayMs
  const saveTimer = useTimeoutFn(() => void saveNow(), () => nextSaveIn, { immediate: false })
  let inFlight: Promise<void> | null = null
  /** the screen is gone: a failed last save is not retried in the background */
  let disposed = false

  const key = computed(() => localCopyKey(toValue(options.outlineId), toValue(options.userId)))
  const label = computed(() => (status.value === 'retrying' ? RETRY_LABELS[retryReason.value] : STATUS_LABELS[status.value]))

  /**
   * Call once with the record the server sent. Returns the outline to edit: the server's, or this
   * browser's unsaved copy when it has one. A copy based on an older version opens a conflict.
   */
  function start(record: OutlineRecord): Outline {
    // The plain document, as the editor keeps it (a record from the query cache is a reactive proxy).
    const doc = toRaw(record.outline)
    version.value = record.version
    baseline.value = doc
    opened = doc
    const local = readLocal()
    if (!local || sameData(local.outline, doc)) {
      removeLocal()
      status.value = 'saved'
      return doc
    }
    restoredFrom.value = local.savedAt
    if (local.baseVersion !== record.version) {
      // the version these edits were made on is not at hand, so every difference is asked about
      conflict.value = { mine: local.outline, theirs: record, merge: mergeScripts(null, local.outline, doc) }
      status.value = 'conflict'
    } else {
      status.value = 'unsaved'
      schedule(delayMs)
    }
    return local.outline
  }

  watch(options.outline, (next) => {
    if (!next || version.value === null) return
    if (next === baseline.value) {
      saveTimer.stop()
      removeLocal()
      if (status.value !== 'saving' && status.value !== 'conflict') status.value = 'saved'
      return
    }
    writeLocal(next)
    // a pending retry sends the newest outline; an edit doesn't bring it forward (the server would only refuse again)
    if (status.value === 'conflict' || status.value === 'retrying') return
    if (status.value !== 'saving') status.value = 'unsaved'
    schedule(delayMs)
  })

  function schedule(ms: number): void {
    nextSaveIn = ms
    saveTimer.start()
  }

  /** Saves at once (used on leaving the screen); resolves when this round is over. */
  function saveNow(): Promise<void> {
    saveTimer.stop()
    if (inFlight) return inFlight
    inFlight = run().finally(() => {
      inFlight = null
    })
    return inFlight
  }

  async function run(): Promise<void> {
    const sending = options.outline.value
    if (!sending || version.value === null || status.value === 'conflict') return
    if (sending === baseline.value) {
      status.value = 'saved'
      return
    }
    status.value = 'saving'
    try {
      landed(await options.save(version.value, sending), sending)
    } catch (error) {
      handleFailure(error, sending)
    }
  }

  /** The server holds `sent` as `summary.version`. */
  function landed(summary: OutlineSummary, sent: Outline): void {
    version.value = summary.version
    baseline.value = sent
    lastError.value = null
    failures = 0
    options.onSaved?.({ ...summary, outline: sent })
    if (options.outline.value === sent) {
      status.value = 'saved'
      removeLocal()
    } else {
      // Edited while the request was out: that newer snapshot still needs saving, and the local copy
      // now builds on the version just saved (else a reload would mistake our own save for someone else's).
      writeLocal(options.outline.value!)
      status.value = 'unsaved'
      schedule(delayMs)
    }
  }

  function handleFailure(error: unknown, sending: Outline): void {
    if (isStaleError<OutlineRecord>(error)) {
      const theirs = error.current
      // A save whose answer was lost (the connection broke after the server stored it) is retried on the
      // version it started from and refused as stale: the newer copy is then our own, not someone else's.
      if (sameData(scriptOf(theirs.outline), scriptOf(sending))) {
        landed(theirs, sending)
        return
      }
      lastError.value = null
      mergeWith(theirs, options.outline.value ?? sending)
      return
    }
    const message = error instanceof Error ? error.message : 'The outline could not be saved.'
    const reason = retryReasonOf(error)
    // A refusal such as 403 or a deleted outline stays on screen with its message while the copy waits locally.
    if (!reason) {
      status.value = 'unsaved'
      lastError.value = message
      return
    }
    status.value = 'retrying'
    retryReason.value = reason
    // the status line already says what an outage means; a server error's own words may tell more
    lastError.value = reason === 'server' ? message : null
    if (!disposed) schedule(retryDelayMs(failures++, { firstMs: retryMs, maxMs: maxRetryMs }))
  }

  /** Merges a newer copy into `mine` line by line: without asking when no line was changed on both sides, else as a conflict. */
  function mergeWith(theirs: OutlineRecord, mine: Outline): void {
    const merge = mergeScripts(baseline.value, mine, toRaw(theirs.outline))
    if (merge.conflicts.length === 0) return takeMerged(theirs, merge.merged)
    conflict.value = { mine, theirs, merge }
    status.value = 'conflict'
  }

  /**
   * A newer copy someone else saved, noticed while editing (not as the answer to a save): merged in at once,
   * so the screen shows their changes within seconds. A save on its way meets it as a conflict of its own.
   */
  function receive(theirs: OutlineRecord): void {
    const mine = options.outline.value
    if (!mine || version.value === null || theirs.version <= version.value) return
    if (status.value === 'saving' || status.value === 'conflict') return
    mergeWith(theirs, mine)
  }

  /**
   * Continues from the server's newer copy with `merged` in the editor: the other person's changes and
   * this browser's together, saved over their version a moment later.
   */
  function takeMerged(theirs: OutlineRecord, merged: Outline): void {
    version.value = theirs.version
    baseline.value = toRaw(theirs.outline)
    options.onSaved?.(theirs)
    status.value = 'unsaved'
    options.replace(merged)
    if (sameData(scriptOf(merged), scriptOf(baseline.value))) {
      // nothing of ours is left to add: what the server holds is what the editor shows
      options.replace(baseline.value)
      status.value = 'saved'
      removeLocal()
    } else schedule(delayMs)
  }

  /** Settles each line and setting both people changed as `choices` say (theirs where none is given), and saves the result. */
  async function settle(choices: Record<string, Side>): Promise<void> {
    const c = conflict.value
    if (!c) return
    conflict.value = null
    restoredFrom.value = null
    takeMerged(c.theirs, settleMerge(c.merge, choices))
    await saveNow()
  }

  /** Saves this browser's outline over the server's newer version. */
  async function keepMine(): Promise<void> {
    const c = conflict.value
    if (!c) return
    conflict.value = null
    version.value = c.theirs.version
    baseline.value = toRaw(c.theirs.outline)
    status.value = 'unsaved'
    // the editor's document, not the snapshot from when the conflict arrived: a line may have committed since
    if (!options.outline.value) options.replace(c.mine)
    await saveNow()
  }

  /** Drops this browser's edits and continues from the server's copy. */
  function takeTheirs(): void {
    const c = conflict.value
    if (!c) return
    conflict.value = null
    version.value = c.theirs.version
    baseline.value = toRaw(c.theirs.outline)
    saveTimer.stop()
    options.replace(baseline.value)
    removeLocal()
    status.value = 'saved'
    restoredFrom.value = null
    options.onSaved?.(c.theirs)
  }

  /** Undoes a restore: back to the server's copy as it was when the screen opened (saved again if needed). */
  function discardRestored(): void {
    restoredFrom.value = null
    if (opened && options.outline.value !== opened) options.replace(opened)
  }

  function dismissRestored(): void {
    restoredFrom.value = null
  }

  function readLocal(): LocalCopy | null {
    adoptUnownedCopy()
    try {
      const raw = localStorage.getItem(key.value)
      if (raw === null) return null
      const parsed = localCopySchema.safeParse(JSON.parse(raw))
      if (parsed.success) return parsed.data
    } catch {
      // Unreadable: treat as absent.
    }
    removeLocal()
    return null
  }

  // Copies kept before they were kept per person have no owner: the first person to open the take gets it,
  // as everyone did then, rather than the edits being dropped.
  function adoptUnownedCopy(): void {
    const unowned = unownedCopyKey(toValue(options.outlineId))
    try {
      const raw = localStorage.getItem(unowned)
      if (raw === null) return
      if (localStorage.getItem(key.value) === null) localStorage.setItem(key.value, raw)
      localStorage.removeItem(unowned)
    } catch {
      // Storage unavailable: there is nothing to adopt.
    }
  }

  function writeLocal(outline: Outline): void {
    if (version.value === null) return
    const copy: LocalCopy = { baseVersion: version.value, savedAt: new Date().toISOString(), outline }
    try {
      localStorage.setItem(key.value, JSON.stringify(copy))
    } catch {
      lastError.value = "This browser can't keep a backup copy (storage is full); changes are only safe once saved."
    }
  }

  function removeLocal(): void {
    try {
      localStorage.removeItem(key.value)
    } catch {
      // Nothing to remove.
    }
  }

  // Closing the tab with edits on their way: the local copy has them, but the browser asks before it goes.
  // Moving to another screen needs no question, because the pending save is sent on the way out (below).
  useUnsavedChangesGuard({ dirty: () => status.value !== 'saved' })
  onScopeDispose(() => {
    disposed = true
    // Leaving the screen: send what's pending now rather than drop the timer (the local copy stays until it lands).
    if (status.value === 'unsaved' || status.value === 'retrying') void saveNow()
    else saveTimer.stop()
  })

  return {
    status, label, version, conflict, restoredFrom, lastError,
    start, saveNow, keepMine, takeTheirs, settle, receive, discardRestored, dismissRestored,
  }
}

export type Autosave = ReturnType<typeof useAutosave>

const STATUS_LABELS: Record<Exclude<SaveStatus, 'retrying'>, string> = {
  saved: 'Saved',
  saving: 'Saving…',
  unsaved: 'Unsaved changes',
  conflict: 'Conflict',
}

const RETRY_LABELS: Record<RetryReason, string> = {
  database: 'Not saved — database unavailable, kept in this browser; retrying…',
  offline: "Not saved — can't reach Gridcue, kept in this browser; retrying…",
  server: 'Not saved — the server had a problem, kept in this browser; retrying…',
}

/** Which failures pass by themselves and are tried again (null: a refusal, shown until the person acts). */
function retryReasonOf(error: unknown): RetryReason | null {
  if (!isApiError(error)) return 'server'
  if (error.status === 0) return 'offline'
  if (error.code === DATABASE_UNAVAILABLE) return 'database'
  return error.status === 429 || error.status >= 500 ? 'server' : null
}

/** Structural equality of JSON-like data, whatever order the keys came in. */
function sameData(a: unknown, b: unknown): boolean {
  if (a === b) return true
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false
  if (Array.isArray(a) !== Array.isArray(b)) return false
  const ka = Object.keys(a).filter((k) => (a as Record<string, unknown>)[k] !== undefined)
  const kb = Object.keys(b).filter((k) => (b as Record<string, unknown>)[k] !== undefined)
  if (ka.length !== kb.length) return false
  return ka.every((k) => sameData((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]))
}
