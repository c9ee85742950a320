import { computed, ref, shallowRef, toRaw } from 'vue'
import { useEventListener } from '@vueuse/core'
import { applyEdit, timeline } from '@shared/script'
import type { Outline, OutlineEdit } from '@shared/script'

export interface OutlineEditorOptions {
  /** Snapshots kept for undo; older ones are dropped. */
  historyLimit?: number
  /** Typing in one line within this long counts as one edit for undo. */
  typingGroupMs?: number
  /** Ctrl+Z / Ctrl+Shift+Z (⌘ on a Mac, Ctrl+Y too) anywhere on the page, script lines included. */
  keyboard?: boolean
}

interface HistoryEntry {
  outline: Outline
  /** Edits with the same key close together in time share one undo entry (typing in a line). */
  key: string | null
  at: number
}

/**
 * The outline being edited, with undo and redo. Every edit goes through shared/script, which returns
 * a new outline and never touches the engine steps, so the history is just a list of snapshots.
 */
export function useOutlineEditor(options: OutlineEditorOptions = {}) {
  const historyLimit = options.historyLimit ?? 200
  const typingGroupMs = options.typingGroupMs ?? 1500

  const outline = shallowRef<Outline | null>(null)
  const past = shallowRef<HistoryEntry[]>([])
  const future = shallowRef<Outline[]>([])
  /** Why the last edit was refused, in the edit function's own words; null after a successful one. */
  const error = ref<string | null>(null)

  const canUndo = computed(() => past.value.length > 0)
  const canRedo = computed(() => future.value.length > 0)
  /** Start times, durations and the total, derived afresh from every snapshot. */
  const timing = computed(() => (outline.value ? timeline(outline.value) : null))

  /** Starts editing a document afresh: no history. */
  function load(next: Outline): void {
    // Documents often arrive from reactive state (the query cache hands out deep proxies). Keep the plain
    // object: every read of a proxy is tracked, and the replay and the script read thousands of fields a step.
    outline.value = toRaw(next)
    past.value = []
    future.value = []
    error.value = null
  }

  /** Runs an edit; on refusal the outline stays as it was and `error` says why. Returns whether it applied. */
  function apply(edit: OutlineEdit): boolean {
    const current = outline.value
    if (!current) return false
    let next: Outline
    try {
      next = applyEdit(current, edit)
    } catch (e) {
      error.value = e instanceof Error ? e.message : String(e)
      return false
    }
    error.value = null
    commit(current, next, edit.op === 'editLineText' ? `text:${edit.lineId}` : null)
    return true
  }

  /**
   * Runs several edits as one: all of them or none (the first refusal leaves the outline as it was and sets
   * `error`), and one undo takes them all back (fitting the script to a target length folds and hides many
   * lines at once). Returns whether they applied.
   */
  function applyAll(edits: readonly OutlineEdit[]): boolean {
    const current = outline.value
    if (!current || edits.length === 0) return false
    let next = current
    try {
      for (const edit of edits) next = applyEdit(next, edit)
    } catch (e) {
      error.value = e instanceof Error ? e.message : String(e)
      return false
    }
    error.value = null
    commit(current, next, null)
    return true
  }

  /** Puts a whole document in place as one undoable step (e.g. taking the server's copy). */
  function replace(next: Outline): void {
    const current = outline.value
    if (!current) return load(next)
    const plain = toRaw(next)
    if (current !== plain) commit(current, plain, null)
  }

  function commit(current: Outline, next: Outline, key: string | null): void {
    const now = Date.now()
    const last = past.value[past.value.length - 1]
    const sameTyping = key !== null && last?.key === key && now - last.at < typingGroupMs && future.value.length === 0
    if (sameTyping) {
      // Keep the snapshot from before the typing started; only the timestamp moves on.
      past.value = [...past.value.slice(0, -1), { ...last, at: now }]
    } else {
      past.value = [...past.value, { outline: current, key, at: now }].slice(-historyLimit)
    }
    future.value = []
    outline.value = next
  }

  function undo(): void {
    const entry = past.value[past.value.length - 1]
    if (!entry || !outline.value) return
    future.value = [outline.value, ...future.value]
    past.value = past.value.slice(0, -1)
    outline.value = entry.outline
    error.value = null
  }

  function redo(): void {
    const [next, ...rest] = future.value
    if (!next || !outline.value) return
    past.value = [...past.value, { outline: outline.value, key: null, at: 0 }]
    future.value = rest
    outline.value = next
    error.value = null
  }

  function clearError(): void {
    error.value = null
  }

  if (options.keyboard) {
    const onKeydown = (event: KeyboardEvent) => {
      if (!(event.ctrlKey || event.metaKey) || event.altKey) return
      const key = event.key.toLowerCase()
      if (key !== 'z' && key !== 'y') return
      // A one-line field (chapter title, pace) keeps its own native undo; so does anything in a dialog.
      const target = event.target instanceof HTMLElement ? event.target : null
      if (target instanceof HTMLInputElement || target?.closest('[role="dialog"]')) return
      event.preventDefault()
      if (key === 'y' || event.shiftKey) redo()
      else undo()
    }
    useEventListener(window, 'keydown', onKeydown)
  }

  return { outline, timing, error, canUndo, canRedo, load, apply, applyAll, replace, undo, redo, clearError }
}

export type OutlineEditor = ReturnType<typeof useOutlineEditor>
